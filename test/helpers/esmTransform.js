// Jest runs CommonJS: the d3 packages (d3-scale, d3-shape and theirs) and office-addin-mock's
// dependencies (uuid, strip-bom, node-fetch and theirs) ship ES modules only,
// so esbuild turns them into CommonJS as Jest loads them. Used by jest.config.js.
'use strict';
const { transformSync } = require('esbuild');

module.exports = {
  process(source, filename) {
    const out = transformSync(source, { loader: 'js', format: 'cjs', target: 'node20', sourcefile: filename });
    return { code: out.code };
  },
};
