/** Jest: TypeScript tests through ts-jest, without type-checking per file (tsc does that in `npm run lint`). */
module.exports = {
  testEnvironment: 'node',
  roots: ['<rootDir>/src', '<rootDir>/test'],
  testMatch: ['**/*.test.ts'],
  transform: {
    '^.+\\.ts$': ['ts-jest', { isolatedModules: true, diagnostics: false }],
    // d3 ships ES modules only: turned into CommonJS by esbuild (test/helpers/esmTransform.js).
    '/node_modules/(d3-[^/]+|internmap)/.+\\.m?js$': '<rootDir>/test/helpers/esmTransform.js',
  },
  transformIgnorePatterns: ['/node_modules/(?!(d3-[^/]+|internmap)/)'],
  reporters: ['default', '<rootDir>/test/summaryReporter.js'],
  testTimeout: 60000,
};
