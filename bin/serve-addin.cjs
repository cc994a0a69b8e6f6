#!/usr/bin/env node
// `npm start`: serves dist/ (the built add-in) over https on
// https://localhost:3000, the origin manifest.xml points at. The certificate
// is the developer certificate of office-addin-dev-certs: on first use it
// creates a local certificate authority in ~/.office-addin-dev-certs and asks
// the system to trust it (on Linux with sudo; on Windows and macOS a prompt).
// CUTLINE_PORT changes the port (then edit manifest.xml to match);
// CUTLINE_CERT_DIR serves with an existing localhost.crt/localhost.key pair.
'use strict';
const fs = require('fs');
const https = require('https');
const path = require('path');

const root = path.resolve(__dirname, '..', 'dist');
const port = Number(process.env.CUTLINE_PORT || 3000);

const TYPES = {
  '.html': 'text/html; charset=utf-8',
  '.js': 'text/javascript; charset=utf-8',
  '.json': 'application/json; charset=utf-8',
  '.css': 'text/css; charset=utf-8',
  '.png': 'image/png',
  '.xml': 'application/xml; charset=utf-8',
  '.txt': 'text/plain; charset=utf-8',
};

async function certificates() {
  const dir = process.env.CUTLINE_CERT_DIR;
  if (dir) return { cert: fs.readFileSync(path.join(dir, 'localhost.crt')), key: fs.readFileSync(path.join(dir, 'localhost.key')) };
  const devCerts = require('office-addin-dev-certs');
  return devCerts.getHttpsServerOptions();
}

function handler(req, res) {
  let rel;
  try {
    rel = decodeURIComponent(new URL(req.url, 'https://localhost').pathname);
  } catch {
    res.writeHead(400).end('bad request');
    return;
  }
  if (rel.endsWith('/')) rel += 'taskpane.html';
  const file = path.resolve(root, '.' + rel);
  // Only files under dist/ are served.
  if (!file.startsWith(root + path.sep) || !fs.existsSync(file) || !fs.statSync(file).isFile()) {
    res.writeHead(404, { 'Content-Type': 'text/plain; charset=utf-8' }).end(`not found: ${rel}`);
    return;
  }
  res.writeHead(200, {
    'Content-Type': TYPES[path.extname(file)] || 'application/octet-stream',
    // Excel caches add-in files hard; during development every reload should see the new build.
    'Cache-Control': 'no-store',
    'Access-Control-Allow-Origin': '*',
  });
  fs.createReadStream(file).pipe(res);
}

async function main() {
  if (!fs.existsSync(path.join(root, 'functions.json'))) {
    console.error('dist/ has no built add-in: run `npm run build` first');
    process.exit(2);
  }
  let options;
  try {
    options = await certificates();
  } catch (e) {
    console.error(`no developer certificate for https://localhost: ${e.message}`);
    console.error('install one with `npx office-addin-dev-certs install` (it asks to trust a local certificate authority), then run `npm start` again');
    process.exit(2);
  }
  https.createServer({ cert: options.cert, key: options.key }, handler).listen(port, () => {
    console.log(`Cutline add-in served from ${root} at https://localhost:${port}/ (manifest: https://localhost:${port}/manifest.xml); Ctrl+C stops`);
  });
}

main();
