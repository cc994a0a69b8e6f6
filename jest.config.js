/** Jest: TypeScript tests through ts-jest, without type-checking per file (tsc does that in `npm run lint`). */

/**
 * Packages that ship ES modules only, turned into CommonJS by esbuild as Jest loads them
 * (test/helpers/esmTransform.js): d3 (the report writers) and office-addin-mock's
 * office-addin-manifest dependencies (uuid, strip-bom, node-fetch and theirs).
 */
const ESM_ONLY = ['d3-[^/]+', 'internmap', 'strip-bom', 'uuid', 'node-fetch', 'data-uri-to-buffer', 'fetch-blob', 'formdata-polyfill'].join('|');

module.exports = {
  testEnvironment: 'node',
  roots: ['<rootDir>/src', '<rootDir>/test'],
  testMatch: ['**/*.test.ts'],
  transform: {
    '^.+\\.ts$': ['ts-jest', { isolatedModules: true, diagnostics: false }],
    [`/node_modules/(${ESM_ONLY})/.+\\.m?js$`]: '<rootDir>/test/helpers/esmTransform.js',
  },
  // Ignored: a file under node_modules unless it belongs to one of those packages (at any depth).
  transformIgnorePatterns: [`/node_modules/(?!.*/node_modules/(${ESM_ONLY})/)(?!(${ESM_ONLY})/)`],
  reporters: ['default', '<rootDir>/test/summaryReporter.js'],
  testTimeout: 60000,
};
