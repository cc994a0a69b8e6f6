#!/usr/bin/env node
// Runs a TypeScript entry point with no separate build step: esbuild bundles it
// into node_modules/.cache/cutline (rebuilt only when a source file is newer),
// then Node runs the bundle. Usage: node bin/run-ts.cjs path/to/entry.ts [args…]
'use strict';
const fs = require('fs');
const path = require('path');

const root = path.resolve(__dirname, '..');

function newestMtime(dir) {
  let newest = 0;
  for (const entry of fs.readdirSync(dir, { withFileTypes: true })) {
    const p = path.join(dir, entry.name);
    if (entry.isDirectory()) newest = Math.max(newest, newestMtime(p));
    else if (entry.name.endsWith('.ts')) newest = Math.max(newest, fs.statSync(p).mtimeMs);
  }
  return newest;
}

/** The project's packages, required at run time rather than bundled, except @stdlib's. */
function externalPackages() {
  const pkg = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8'));
  return Object.keys({ ...pkg.dependencies, ...pkg.devDependencies }).filter((name) => !name.startsWith('@stdlib/'));
}

function bundled(entry) {
  const abs = path.resolve(root, entry);
  const name = path.relative(root, abs).replace(/[\\/]/g, '_').replace(/\.ts$/, '') + '.cjs';
  const out = path.join(root, 'node_modules', '.cache', 'cutline', name);
  let fresh = false;
  try {
    const built = fs.statSync(out).mtimeMs;
    const dirs = ['src', path.relative(root, path.dirname(abs))].map((d) => path.join(root, d));
    fresh = dirs.every((d) => !fs.existsSync(d) || newestMtime(d) < built);
  } catch (_) {
    fresh = false;
  }
  if (!fresh) {
    // Build in memory, then write a private file and rename it into place:
    // processes started together (parallel tests) never read a half-written bundle.
    const result = require('esbuild').buildSync({
      entryPoints: [abs],
      outfile: out,
      write: false,
      bundle: true,
      platform: 'node',
      target: 'node20',
      format: 'cjs',
      // Packages stay outside the bundle (required at run time), except @stdlib: its distributions
      // are hundreds of one-function modules, ~30 ms to resolve and load one by one at every start,
      // ~3 ms inside the bundle (README "Speed").
      external: externalPackages(),
      logLevel: 'error',
    });
    fs.mkdirSync(path.dirname(out), { recursive: true });
    const tmp = `${out}.${process.pid}.tmp`;
    fs.writeFileSync(tmp, result.outputFiles[0].contents);
    fs.renameSync(tmp, out);
  }
  return out;
}

module.exports = { bundled };

if (require.main === module) {
  const [entry, ...rest] = process.argv.slice(2);
  if (!entry) {
    process.stderr.write('usage: node bin/run-ts.cjs ENTRY.ts [args…]\n');
    process.exit(1);
  }
  process.argv = [process.argv[0], entry, ...rest];
  require(bundled(entry));
}
