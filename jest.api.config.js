// API tests: the real Express app (supertest) against the real PostgreSQL test database.
/** @type {import('jest').Config} */
module.exports = {
  displayName: 'api',
  testEnvironment: 'node',
  rootDir: __dirname,
  testMatch: ['<rootDir>/tests/api/**/*.test.ts'],
  transform: { '^.+\\.(t|j|mj)s$': ['@swc/jest'] },
  transformIgnorePatterns: ['/node_modules/(?!(jsts|fast-check|shpjs|@turf)/)'],
  moduleFileExtensions: ['ts', 'js', 'mjs', 'json'],
  testTimeout: 30000,
};
