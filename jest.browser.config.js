// Browser tests: the built app served by the real server, driven in Debian's Chromium.
/** @type {import('jest').Config} */
module.exports = {
  displayName: 'browser',
  testEnvironment: 'node',
  rootDir: __dirname,
  testMatch: ['<rootDir>/tests/browser/**/*.test.ts'],
  transform: { '^.+\\.(t|j|mj)s$': ['@swc/jest'] },
  transformIgnorePatterns: ['/node_modules/(?!(jsts|fast-check|shpjs|@turf)/)'],
  moduleFileExtensions: ['ts', 'js', 'mjs', 'json'],
  testTimeout: 90000,
  testSequencer: '<rootDir>/tests/browser/sequencer.js',
};
