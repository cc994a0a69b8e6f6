// A Jest transform for the few dependencies published only as ES modules
// (office-addin-manifest's uuid, strip-bom and node-fetch, which
// office-addin-mock loads): esbuild rewrites them to CommonJS, which Jest's
// module runtime needs. jest.config.js lists the packages.
'use strict';
const { transformSync } = require('esbuild');

module.exports = {
  process(source, filename) {
    const out = transformSync(source, { format: 'cjs', loader: 'js', target: 'node20', sourcefile: filename, sourcemap: 'inline' });
    return { code: out.code };
  },
};
