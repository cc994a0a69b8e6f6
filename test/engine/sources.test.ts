// The engine speaks in its own words and has one door (docs/engine-api.md): no command-line flag
// ("--cutoff") and no pointer to a document section the user lacks ("METHODS §4") in any string
// of the engine's sources; faces, the input layer and the benchmarks import the engine only
// through src/engine/index.ts; and inside the engine a folder reaches another only through
// that folder's index.ts.
import * as fs from 'fs';
import * as path from 'path';

const root = path.join(__dirname, '..', '..');

function tsFiles(dir: string): string[] {
  return fs.readdirSync(path.join(root, dir), { withFileTypes: true }).flatMap((e) => {
    const rel = path.join(dir, e.name);
    if (e.isDirectory()) return tsFiles(rel);
    return e.name.endsWith('.ts') ? [rel] : [];
  });
}

/** The string and template literals of a TypeScript source, comments left out. */
export function stringsOf(src: string): string[] {
  const out: string[] = [];
  let i = 0;
  while (i < src.length) {
    const c = src[i];
    if (c === '/' && src[i + 1] === '/') i = src.indexOf('\n', i) < 0 ? src.length : src.indexOf('\n', i);
    else if (c === '/' && src[i + 1] === '*') i = src.indexOf('*/', i + 2) + 2;
    else if (c === "'" || c === '"' || c === '`') {
      let j = i + 1;
      while (j < src.length && src[j] !== c) j += src[j] === '\\' ? 2 : 1;
      out.push(src.slice(i + 1, j));
      i = j + 1;
    } else i++;
  }
  return out;
}

const engine = tsFiles('src/engine');

test('the literal scanner finds strings and skips comments', () => {
  expect(stringsOf("// '--no'\nconst a = 'x --flag'; /* \"--not\" */ const b = `t ${1} METHODS §4`;")).toEqual(['x --flag', 't ${1} METHODS §4']);
});

test('no engine message names a command-line flag or a METHODS section', () => {
  const found = engine.flatMap((f) =>
    stringsOf(fs.readFileSync(path.join(root, f), 'utf8'))
      .filter((s) => /(^|[\s(:'"])--[a-z]/.test(s) || /METHODS/.test(s))
      .map((s) => `${f}: ${s}`),
  );
  expect(found).toEqual([]);
  expect(engine.length).toBeGreaterThan(50);
});

const importRe = /(?:import|export)\s[^;]*?from\s+'([^']+)'/g;

test('faces, the input layer and the benchmarks import the engine only through its index', () => {
  const outside = [...tsFiles('src').filter((f) => !f.startsWith(path.join('src', 'engine'))), ...tsFiles('bench')];
  const bad: string[] = [];
  let viaIndex = 0;
  for (const f of outside) {
    for (const m of fs.readFileSync(path.join(root, f), 'utf8').matchAll(importRe)) {
      const target = path.normalize(path.join(path.dirname(f), m[1]));
      if (!target.startsWith(path.join('src', 'engine'))) continue;
      if (target === path.join('src', 'engine')) viaIndex++;
      else bad.push(`${f} imports ${m[1]}`);
    }
  }
  expect(bad).toEqual([]);
  expect(viaIndex).toBeGreaterThan(5);
});

test('inside the engine, a folder reaches another folder only through its index.ts', () => {
  const bad: string[] = [];
  for (const f of engine) {
    const folder = path.dirname(f);
    for (const m of fs.readFileSync(path.join(root, f), 'utf8').matchAll(importRe)) {
      if (!m[1].startsWith('.')) continue;
      const target = path.normalize(path.join(folder, m[1]));
      const targetFolder = fs.existsSync(path.join(root, target)) && fs.statSync(path.join(root, target)).isDirectory() ? target : path.dirname(target);
      if (targetFolder === folder || targetFolder === path.join('src', 'engine')) continue;
      if (target !== targetFolder) bad.push(`${f} imports ${m[1]}`);
    }
  }
  expect(bad).toEqual([]);
});
