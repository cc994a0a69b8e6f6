// manifest.xml: read by office-addin-manifest's own reader (its online
// validator is unreachable here), then checked for structure against the
// add-in only manifest's documented elements (Office Add-ins documentation:
// shared runtime, custom functions extension point) and against the build's
// output names in dist/.
import * as fs from 'fs';
import * as path from 'path';
import { parseStringPromise } from 'xml2js';
import { OfficeAddinManifest } from 'office-addin-manifest';

const root = path.resolve(__dirname, '..', '..');
const MANIFEST = path.join(root, 'manifest.xml');
const ORIGIN = 'https://localhost:3000/';

// eslint-disable-next-line @typescript-eslint/no-explicit-any
type Node = any;
let xml: Node;
let host: Node;
const urls = new Map<string, string>();
const strings = new Map<string, string>();
const images = new Map<string, string>();

beforeAll(async () => {
  xml = (await parseStringPromise(fs.readFileSync(MANIFEST, 'utf8'))).OfficeApp;
  const vo = xml.VersionOverrides[0];
  host = vo.Hosts[0].Host[0];
  const res = vo.Resources[0];
  for (const u of res['bt:Urls'][0]['bt:Url']) urls.set(u.$.id, u.$.DefaultValue);
  for (const s of [...res['bt:ShortStrings'][0]['bt:String'], ...res['bt:LongStrings'][0]['bt:String']]) strings.set(s.$.id, s.$.DefaultValue);
  for (const i of res['bt:Images'][0]['bt:Image']) images.set(i.$.id, i.$.DefaultValue);
});

/** A file the build puts in dist/, from its URL (the test run builds first). */
const built = (url: string): string => path.join(root, 'dist', url.slice(ORIGIN.length));

test('office-addin-manifest reads it: id, version, names, host, permission, start page', async () => {
  const info = await OfficeAddinManifest.readManifestFile(MANIFEST);
  expect(info.id).toMatch(/^[0-9a-f]{8}-[0-9a-f]{4}-4[0-9a-f]{3}-[89ab][0-9a-f]{3}-[0-9a-f]{12}$/);
  expect(info.version).toBe('0.1.0.0');
  expect(info.displayName).toBe('Cutline');
  expect(info.providerName).toBe('Cutline');
  expect(info.officeAppType).toBe('TaskPaneApp');
  expect(info.hosts).toEqual(['Workbook']);
  // The least permission that lets the task pane write a summary sheet.
  expect(info.permissions).toBe('ReadWriteDocument');
  expect(info.defaultSettings?.sourceLocation).toBe(`${ORIGIN}taskpane.html`);
  expect(info.appDomains).toEqual(['https://localhost:3000']);
  // The manifest's version follows package.json's (major.minor.patch.0).
  const pkg = JSON.parse(fs.readFileSync(path.join(root, 'package.json'), 'utf8'));
  expect(info.version).toBe(`${pkg.version}.0`);
});

test('requirement sets: shared runtime 1.1 and custom functions 1.1, nothing else claimed', () => {
  const sets = xml.Requirements[0].Sets[0].Set.map((s: Node) => [s.$.Name, s.$.MinVersion]);
  expect(sets).toEqual([
    ['SharedRuntime', '1.1'],
    ['CustomFunctionsRuntime', '1.1'],
  ]);
});

test('one shared runtime hosts the functions, the function file and the task pane', () => {
  const runtimes = host.Runtimes[0].Runtime;
  expect(runtimes).toHaveLength(1);
  expect(runtimes[0].$.lifetime).toBe('long');
  const runtime = runtimes[0].$.resid;
  expect(urls.get(runtime)).toBe(`${ORIGIN}taskpane.html`);
  const cf = host.AllFormFactors[0].ExtensionPoint.find((e: Node) => e.$['xsi:type'] === 'CustomFunctions');
  expect(cf.Page[0].SourceLocation[0].$.resid).toBe(runtime);
  const desktop = host.DesktopFormFactor[0];
  expect(desktop.FunctionFile[0].$.resid).toBe(runtime);
  const button = desktop.ExtensionPoint[0].OfficeTab[0].Group[0].Control[0];
  expect(button.$['xsi:type']).toBe('Button');
  expect(button.Action[0].$['xsi:type']).toBe('ShowTaskpane');
  expect(button.Action[0].SourceLocation[0].$.resid).toBe(runtime);
});

test('the custom functions extension point: the CUTLINE namespace, the script and the generated metadata', () => {
  const cf = host.AllFormFactors[0].ExtensionPoint.find((e: Node) => e.$['xsi:type'] === 'CustomFunctions');
  expect(strings.get(cf.Namespace[0].$.resid)).toBe('CUTLINE');
  expect(urls.get(cf.Script[0].SourceLocation[0].$.resid)).toBe(`${ORIGIN}functions.js`);
  expect(urls.get(cf.Metadata[0].SourceLocation[0].$.resid)).toBe(`${ORIGIN}functions.json`);
});

test('every resource id used is defined, every URL is on the origin and is a file the build makes', () => {
  const text = fs.readFileSync(MANIFEST, 'utf8');
  const used = [...text.matchAll(/resid="([^"]+)"/g)].map((m) => m[1]);
  for (const id of used) expect(urls.has(id) || strings.has(id) || images.has(id)).toBe(true);
  const all = [...urls.values(), ...images.values(), ...[...text.matchAll(/DefaultValue="(https:[^"]+)"/g)].map((m) => m[1])];
  for (const u of all) {
    expect(u.startsWith(ORIGIN)).toBe(true);
    expect(fs.existsSync(built(u))).toBe(true);
  }
});

test('icons: PNGs of the sizes the manifest declares', () => {
  const size = (file: string): [number, number] => {
    const b = fs.readFileSync(file);
    expect(b.subarray(1, 4).toString('ascii')).toBe('PNG');
    return [b.readUInt32BE(16), b.readUInt32BE(20)];
  };
  const button = host.DesktopFormFactor[0].ExtensionPoint[0].OfficeTab[0].Group[0].Control[0];
  for (const img of button.Icon[0]['bt:Image']) {
    const n = Number(img.$.size);
    expect(size(path.join(root, 'assets', path.basename(images.get(img.$.resid)!)))).toEqual([n, n]);
  }
  expect(size(path.join(root, 'assets', path.basename(xml.IconUrl[0].$.DefaultValue)))).toEqual([32, 32]);
  expect(size(path.join(root, 'assets', path.basename(xml.HighResolutionIconUrl[0].$.DefaultValue)))).toEqual([64, 64]);
});

test('the shared runtime page loads office.js from the add-in’s origin, then the functions and the pane', () => {
  const html = fs.readFileSync(path.join(root, 'dist', 'taskpane.html'), 'utf8');
  const scripts = [...html.matchAll(/<script[^>]*src="([^"]+)"/g)].map((m) => m[1]);
  expect(scripts).toEqual(['office/office.js', 'functions.js', 'taskpane.js']);
  for (const s of scripts) expect(fs.existsSync(path.join(root, 'dist', s))).toBe(true);
  // office.js finds its host scripts beside itself: Excel's are there.
  expect(fs.readdirSync(path.join(root, 'dist', 'office')).some((f) => /^excel-win32-.*\.js$/.test(f))).toBe(true);
});
