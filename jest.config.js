/**
 * One `npx jest` runs every unit and integration test in three projects:
 * - web: Angular components and client services (jsdom, jest-preset-angular);
 * - shared: the pure domain engine (node), which must keep 90 % line coverage;
 * - server: Express services and the HTTP + database stories in tests/ (node, real SQLite).
 * End-to-end tests live in e2e/ and run in Chromium through `npm run test:e2e`.
 */
const nodeTransform = { '^.+\\.ts$': ['ts-jest', { tsconfig: '<rootDir>/tsconfig.server.json' }] };

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
      transformIgnorePatterns: ['node_modules/(?!.*\\.mjs$)'],
    },
    {
      displayName: 'shared',
      testEnvironment: 'node',
      testMatch: ['<rootDir>/shared/**/*.spec.ts'],
      transform: nodeTransform,
    },
    {
      displayName: 'server',
      testEnvironment: 'node',
      testMatch: ['<rootDir>/server/**/*.spec.ts', '<rootDir>/tests/**/*.test.ts'],
      transform: nodeTransform,
      testTimeout: 30000,
    },
  ],
  collectCoverageFrom: ['shared/**/*.ts', '!shared/**/*.spec.ts', '!shared/**/index.ts'],
  coverageReporters: ['text-summary', 'lcov'],
  coverageThreshold: { './shared/': { lines: 90 } },
};
