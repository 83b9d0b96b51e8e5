/**
 * One `npx jest` runs every unit and integration test in three projects:
 * - web: Angular components and client services (jsdom, jest-preset-angular);
 * - shared: the pure domain engine (node), which must keep 90 % line coverage;
 * - server: Express services and the HTTP + database stories in tests/ (node, real SQLite).
 * End-to-end tests live in e2e/ and run in Chromium through `npm run test:e2e`.
 */
const nodeTransform = { '^.+\\.ts$': ['ts-jest', { tsconfig: '<rootDir>/tsconfig.server.json' }] };
// delaunator and kdbush are published as ES modules, and Jest's own CommonJS loader (which runs ts-jest's
// output) cannot require an ES module the way Node 20.19+ can. Both packages also ship a UMD build of the
// same code beside it, so the node projects load that instead; Node and the Angular build use the ES module.
const esmOnlyPackages = {
  '^delaunator$': '<rootDir>/node_modules/delaunator/delaunator.js',
  '^kdbush$': '<rootDir>/node_modules/kdbush/kdbush.js',
};

module.exports = {
  projects: [
    {
      displayName: 'web',
      preset: 'jest-preset-angular',
      testEnvironment: 'jsdom',
      setupFilesAfterEnv: ['<rootDir>/setup-jest.ts'],
      testMatch: ['<rootDir>/src/**/*.spec.ts'],
      transform: {
        '^.+\\.(ts|js|mjs|html|svg)$': [
          'jest-preset-angular',
          { tsconfig: '<rootDir>/tsconfig.spec.json', stringifyContentPathRegex: '\\.(html|svg)$' },
        ],
      },
      // Angular's CLDR locale files and Transloco's helpers are ES modules in .js files.
      transformIgnorePatterns: ['node_modules/(?!.*\\.mjs$|@angular/common/locales/|@jsverse/)'],
      // Client code that runs the engine (an estimate made on the device) loads it the same way.
      moduleNameMapper: esmOnlyPackages,
    },
    {
      displayName: 'shared',
      testEnvironment: 'node',
      testMatch: ['<rootDir>/shared/**/*.spec.ts'],
      transform: nodeTransform,
      moduleNameMapper: esmOnlyPackages,
    },
    {
      displayName: 'server',
      testEnvironment: 'node',
      testMatch: ['<rootDir>/server/**/*.spec.ts', '<rootDir>/tests/**/*.test.ts'],
      transform: nodeTransform,
      moduleNameMapper: esmOnlyPackages,
      testTimeout: 30000,
    },
  ],
  collectCoverageFrom: ['shared/**/*.ts', '!shared/**/*.spec.ts', '!shared/**/index.ts'],
  coverageReporters: ['text-summary', 'lcov'],
  coverageThreshold: { './shared/': { lines: 90 } },
};
