// Unit specs of the pure shared/ code and the server's own units (no database).
/** @type {import('jest').Config} */
module.exports = {
  displayName: 'unit',
  testEnvironment: 'node',
  rootDir: __dirname,
  testMatch: ['<rootDir>/shared/**/*.spec.ts', '<rootDir>/server/**/*.spec.ts', '<rootDir>/scripts/**/*.spec.ts'],
  transform: { '^.+\\.(t|j|mj)s$': ['@swc/jest'] },
  // ESM-only packages must be compiled to CommonJS for jest.
  transformIgnorePatterns: ['/node_modules/(?!(jsts|fast-check|shpjs|@turf)/)'],
  moduleFileExtensions: ['ts', 'js', 'mjs', 'json'],
};
