/** Jest: TypeScript tests through ts-jest, without type-checking per file (tsc does that in `npm run lint`). */
/** Packages that ship only ES modules, reached through office-addin-mock → office-addin-manifest. */
const ESM_ONLY = ['strip-bom', 'uuid', 'node-fetch', 'data-uri-to-buffer', 'fetch-blob', 'formdata-polyfill'];

module.exports = {
  testEnvironment: 'node',
  roots: ['<rootDir>/src', '<rootDir>/test'],
  testMatch: ['**/*.test.ts'],
  transform: {
    '^.+\\.ts$': ['ts-jest', { isolatedModules: true, diagnostics: false }],
    // Dependencies of office-addin-mock published only as ES modules (see the file).
    '^.+\\.m?js$': '<rootDir>/test/helpers/esmToCommonjs.cjs',
  },
  // Ignored: a file under node_modules unless it belongs to one of those packages (at any depth).
  transformIgnorePatterns: [`/node_modules/(?!.*/node_modules/(${ESM_ONLY.join('|')})/)(?!(${ESM_ONLY.join('|')})/)`],
  reporters: ['default', '<rootDir>/test/summaryReporter.js'],
  testTimeout: 60000,
};
