/**
 * The project's own method document (docs/methods.md) is what the README and
 * the code cite: every "docs/methods.md §N" or "§N.M" they name must be a
 * heading there, and nothing a user reads may point outside the repository
 * (no "../shared/…" path).
 */
import * as fs from 'fs';
import * as path from 'path';

const root = path.join(__dirname, '..', '..');
const read = (rel: string): string => fs.readFileSync(path.join(root, rel), 'utf8');

function filesUnder(dir: string): string[] {
  return fs.readdirSync(path.join(root, dir), { withFileTypes: true }).flatMap((e) => {
    const rel = path.join(dir, e.name);
    if (e.isDirectory()) return filesUnder(rel);
    return /\.(ts|md)$/.test(e.name) ? [rel] : [];
  });
}

/** Section numbers of the headings of docs/methods.md: "## 4. …" gives 4, "### 4.8 …" gives 4.8. */
function methodSections(): Set<string> {
  const out = new Set<string>();
  for (const m of read('docs/methods.md').matchAll(/^#{2,3} (\d+(?:\.\d+)?)\.? /gm)) out.add(m[1]);
  return out;
}

/** Every section a text cites as "docs/methods.md §a", "§a and §b", "§a–§b" (the run of § right after the name). */
function citedSections(text: string): string[] {
  const out: string[] = [];
  for (const m of text.matchAll(/docs\/methods\.md\)?,?[\s*]*((?:§\d+(?:\.\d+)?(?:[\s*]*(?:,|and|–|-|\(\w+\))[\s*]*)*)+)/g)) {
    for (const s of m[1].matchAll(/§(\d+(?:\.\d+)?)/g)) out.push(s[1]);
  }
  return out;
}

const userFacing = ['README.md', ...filesUnder('docs'), ...filesUnder('src')];

describe('docs/methods.md is the method document the project cites', () => {
  const sections = methodSections();

  test('it has the twelve numbered sections and their subsections', () => {
    for (let k = 1; k <= 12; k++) expect(sections.has(String(k))).toBe(true);
    for (const s of ['2.3', '2.5', '3.5', '4.5', '4.7', '4.8', '4.9', '4.11', '6.3']) expect(sections.has(s)).toBe(true);
  });

  test('the README, docs and sources cite only sections that exist', () => {
    const missing: string[] = [];
    let cited = 0;
    for (const f of userFacing) {
      for (const s of citedSections(read(f))) {
        cited++;
        if (!sections.has(s)) missing.push(`${f}: §${s}`);
      }
    }
    expect(missing).toEqual([]);
    // The sources and the README do cite it (a regex that matched nothing would pass vacuously).
    expect(cited).toBeGreaterThan(30);
  });

  test('the parser of citations reads lists and ranges', () => {
    expect(citedSections('see docs/methods.md §4.9, and docs/methods.md\n * §6–§8 and §11')).toEqual(['4.9', '6', '8', '11']);
  });

  test('nothing a user reads points outside the repository', () => {
    const outside = userFacing.filter((f) => /\.\.\/shared\/|shared\/METHODS/.test(read(f)));
    expect(outside).toEqual([]);
  });

  test('the README sends readers of its Methods section to docs/methods.md', () => {
    const readme = read('README.md');
    const methods = readme.slice(readme.indexOf('## Methods'), readme.indexOf('\n## ', readme.indexOf('## Methods') + 1));
    expect(methods).toContain('(docs/methods.md)');
  });
});
