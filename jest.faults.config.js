// Fault tests: the real server process against a PostgreSQL cluster of their own, which they stop
// and start, and mail servers that misbehave. `npm test -- faults` sets up that cluster.
/** @type {import('jest').Config} */
module.exports = {
  displayName: 'faults',
  testEnvironment: 'node',
  rootDir: __dirname,
  testMatch: ['<rootDir>/tests/faults/**/*.test.ts'],
  transform: { '^.+\\.(t|j|mj)s$': ['@swc/jest'] },
  transformIgnorePatterns: ['/node_modules/(?!(jsts|fast-check|shpjs|@turf)/)'],
  moduleFileExtensions: ['ts', 'js', 'mjs', 'json'],
  testTimeout: 120000,
};
