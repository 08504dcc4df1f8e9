// Client specs: Angular components and services under jsdom, zoneless like the app.
const { createCjsPreset } = require('jest-preset-angular/presets');

/** @type {import('jest').Config} */
module.exports = {
  ...createCjsPreset({ tsconfig: '<rootDir>/tsconfig.spec.json' }),
  displayName: 'client',
  rootDir: __dirname,
  testEnvironment: 'jsdom',
  // Map specs draw with Leaflet under jsdom; on a busy two-core machine 5 s was not always enough.
  testTimeout: 15000,
  testMatch: ['<rootDir>/src/**/*.spec.ts'],
  setupFilesAfterEnv: ['<rootDir>/src/test-setup.ts'],
  moduleNameMapper: {
    '^@shared/(.*)$': '<rootDir>/shared/$1',
  },
};
