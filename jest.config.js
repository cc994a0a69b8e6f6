/** Jest: TypeScript tests through ts-jest, without type-checking per file (tsc does that in `npm run lint`). */
module.exports = {
  testEnvironment: 'node',
  roots: ['<rootDir>/src', '<rootDir>/test'],
  testMatch: ['**/*.test.ts'],
  transform: { '^.+\\.ts$': ['ts-jest', { isolatedModules: true, diagnostics: false }] },
  reporters: ['default', '<rootDir>/test/summaryReporter.js'],
  testTimeout: 60000,
};
