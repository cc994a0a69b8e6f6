// `npm start`'s server (bin/serve-addin.cjs) serves the built add-in over
// https with a developer certificate made by office-addin-dev-certs (here in a
// temporary folder, trusted by this test only): the files the manifest
// names are there, nothing outside dist/ is.
import { ChildProcess, spawn } from 'child_process';
import * as fs from 'fs';
import * as https from 'https';
import * as os from 'os';
import * as path from 'path';
import { generateCertificates } from 'office-addin-dev-certs';

const root = path.resolve(__dirname, '..', '..');
const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'cutline-certs-'));
const port = 41000 + (process.pid % 2000);
let server: ChildProcess;

function get(p: string, ca: Buffer): Promise<{ status: number; type: string; body: string }> {
  return new Promise((resolve, reject) => {
    https
      .get({ host: 'localhost', port, path: p, ca }, (res) => {
        let body = '';
        res.on('data', (d) => (body += d));
        res.on('end', () => resolve({ status: res.statusCode ?? 0, type: String(res.headers['content-type']), body }));
      })
      .on('error', reject);
  });
}

beforeAll(async () => {
  // office-addin-dev-certs says what it did on the console; the test says it instead.
  const log = jest.spyOn(console, 'log').mockImplementation(() => undefined);
  await generateCertificates(path.join(dir, 'ca.crt'), path.join(dir, 'localhost.crt'), path.join(dir, 'localhost.key'), 1, ['localhost', '127.0.0.1']);
  log.mockRestore();
  server = spawn(process.execPath, [path.join(root, 'bin/serve-addin.cjs')], {
    env: { ...process.env, CUTLINE_PORT: String(port), CUTLINE_CERT_DIR: dir },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  await new Promise<void>((resolve, reject) => {
    server.stdout!.on('data', (d) => String(d).includes('served') && resolve());
    server.stderr!.on('data', (d) => reject(new Error(String(d))));
  });
});

afterAll(() => {
  server?.kill();
  fs.rmSync(dir, { recursive: true, force: true });
});

test('the manifest’s files are served over https with the developer certificate', async () => {
  const ca = fs.readFileSync(path.join(dir, 'ca.crt'));
  const meta = await get('/functions.json', ca);
  expect(meta.status).toBe(200);
  expect(meta.type).toMatch(/^application\/json/);
  expect(JSON.parse(meta.body).functions).toHaveLength(10);
  for (const p of ['/taskpane.html', '/functions.js', '/taskpane.js', '/office/office.js', '/assets/icon-32.png', '/manifest.xml']) {
    expect((await get(p, ca)).status).toBe(200);
  }
  expect((await get('/', ca)).body).toContain('<title>Cutline</title>');
  expect((await get('/../package.json', ca)).status).toBe(404);
  expect((await get('/%2e%2e/package.json', ca)).status).toBe(404);
});
