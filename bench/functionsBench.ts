/**
 * Speed of the worksheet functions (issue 10), from ranges shaped as Excel
 * hands them (one array per row, a title cell, a few blank cells), 100,000
 * rows of a seeded curved fuzzy design. Targets: EFFECT under 50 ms cold;
 * VALIDITY with 999 draws under 0.5 s cold; a repeated call with unchanged
 * inputs under 1 ms; the ten functions of a summary sheet after a change of
 * the cutoff under 1 s in all.
 * Each figure is given as wall and CPU time (this process only), median and
 * fastest: on a machine shared with other work the CPU time and the fastest
 * run are the fairer measure of the work itself.
 *
 * "Cold" = the functions' cache empty (new ranges, forgetAll()); the first call in the process also pays for
 * compiling the code, reported apart.
 * Run: node bin/run-ts.cjs bench/functionsBench.ts
 */
import * as os from 'os';
import { performance } from 'perf_hooks';
import { complierEffect, Random } from '../src/engine';
import { rangeColumns } from '../src/input/range';
import { balance } from '../src/functions/balance';
import { bandwidth } from '../src/functions/bandwidth';
import { bins } from '../src/functions/bins';
import { forgetAll, rangesKey, readRanges } from '../src/functions/call';
import { compliercdf } from '../src/functions/complierCdf';
import { complierdensity } from '../src/functions/complierDensity';
import { densitytest } from '../src/functions/densityTest';
import { effect } from '../src/functions/effect';
import { jump } from '../src/functions/jump';
import { takeup } from '../src/functions/takeup';
import { validity } from '../src/functions/validity';

// The runtime's error class, for the rare error path (none is expected here).
(globalThis as Record<string, unknown>).CustomFunctions = {
  Error: class {
    constructor(
      readonly code: string,
      readonly message?: string,
    ) {}
  },
  ErrorCode: { invalidValue: '#VALUE!', notAvailable: '#N/A', invalidNumber: '#NUM!' },
};

const N = 100000;

/** Excel-shaped columns: a title, then one cell per row; every 5,000th outcome blank. */
function sheet(seed: number): { score: unknown[][]; treated: unknown[][]; outcome: unknown[][]; age: unknown[][] } {
  const rng = new Random(seed);
  const score: unknown[][] = [['score']];
  const treated: unknown[][] = [['treated']];
  const outcome: unknown[][] = [['outcome']];
  const age: unknown[][] = [['age']];
  for (let i = 0; i < N; i++) {
    const r = rng.normal();
    const p = Math.min(0.95, Math.max(0.02, (r >= 0 ? 0.6 : 0.2) + 0.15 * r - 0.08 * r * r));
    const d = rng.uniform() < p ? 1 : 0;
    const y = 1 + r + 0.8 * r * r - 0.3 * r * r * r + 0.5 * d + rng.normal();
    score.push([Number(r.toFixed(6))]);
    treated.push([d === 1]);
    outcome.push([i % 5000 === 17 ? '' : Number(y.toFixed(6))]);
    age.push([Math.floor(20 + 40 * rng.uniform())]);
  }
  return { score, treated, outcome, age };
}

const copy = (cells: unknown[][]): unknown[][] => cells.map((r) => [...r]);

/** Wall and CPU milliseconds of one call (CPU time counts this process only: a fairer figure on a shared machine). */
interface Time {
  wall: number;
  cpu: number;
}
async function ms(f: () => unknown): Promise<Time> {
  const c = process.cpuUsage();
  const t = performance.now();
  await f();
  const wall = performance.now() - t;
  const u = process.cpuUsage(c);
  return { wall, cpu: (u.user + u.system) / 1000 };
}

function median(v: Time[]): Time {
  const mid = (x: number[]): number => [...x].sort((a, b) => a - b)[Math.floor(x.length / 2)];
  return { wall: mid(v.map((t) => t.wall)), cpu: mid(v.map((t) => t.cpu)) };
}

/** The fastest of several runs: on a shared machine the least disturbed estimate of the work itself. */
function fastest(v: Time[]): Time {
  return { wall: Math.min(...v.map((t) => t.wall)), cpu: Math.min(...v.map((t) => t.cpu)) };
}

const fmt = (v: number): string => (v < 10 ? v.toFixed(2) : v.toFixed(0));

async function main(): Promise<void> {
  const sheets = [1, 2, 3, 4, 5, 6].map(sheet);
  const at = [[-1], [0], [1], [2], [3]];
  const first = sheets[0];
  const firstEffect = await ms(() => effect(first.score, first.treated, first.outcome, 0));
  forgetAll();
  const firstValidity = await ms(() => validity(first.score, first.treated, first.outcome, 0));

  const coldEffect: Time[] = [];
  const coldValidity: Time[] = [];
  for (const s of sheets.slice(1)) {
    forgetAll();
    coldEffect.push(await ms(() => effect(s.score, s.treated, s.outcome, 0)));
    forgetAll();
    coldValidity.push(await ms(() => validity(s.score, s.treated, s.outcome, 0)));
  }

  // Repeated calls: new arrays with the same cells (as Excel passes them at a recalculation).
  const s = sheets[1];
  const repeatEffect: Time[] = [];
  const repeatValidity: Time[] = [];
  for (let k = 0; k < 15; k++) {
    const [a, b, c] = [copy(s.score), copy(s.treated), copy(s.outcome)];
    repeatEffect.push(await ms(() => effect(a, b, c, 0)));
    repeatValidity.push(await ms(() => validity(a, b, c, 0)));
  }

  // Floors. Any exact recognition of unchanged cells reads every cell once: a bare pass over the three ranges' cells
  // (fresh arrays, as above) is the least it can cost. EFFECT cold is the reading plus the engine: the engine's call
  // alone on the same Float64Arrays, and the reading alone (no cache).
  const barePass: Time[] = [];
  let sink = 0;
  for (let k = 0; k < 15; k++) {
    const three = [copy(s.score), copy(s.treated), copy(s.outcome)];
    barePass.push(
      await ms(() => {
        for (const cells of three) for (let i = 0; i < cells.length; i++) if (typeof cells[i][0] === 'number') sink++;
      }),
    );
  }
  const engineAlone: Time[] = [];
  const reading: Time[] = [];
  for (const t of sheets.slice(1)) {
    const specs = [
      { argument: 'score', cells: t.score },
      { argument: 'treated', cells: t.treated, binary: true },
      { argument: 'outcome', cells: t.outcome },
    ];
    let cols = rangeColumns(specs);
    reading.push(await ms(() => (cols = rangeColumns(specs))));
    const missing = { score: cols[0].missing, treated: cols[1].missing, outcome: cols[2].missing };
    engineAlone.push(await ms(() => complierEffect(cols[0].values, cols[1].values, cols[2].values, 0, { missing })));
  }
  // The functions' own part of a cold call: recognising the ranges (a miss) and reading them into checked columns.
  const layer: Time[] = [];
  for (const t of sheets.slice(1)) {
    const specs = [
      { argument: 'score', cells: t.score, position: 0 },
      { argument: 'treated', cells: t.treated, position: 1, binary: true },
      { argument: 'outcome', cells: t.outcome, position: 2 },
    ];
    forgetAll();
    layer.push(await ms(() => readRanges(specs, rangesKey(specs))));
  }
  if (sink < 0) process.stdout.write('');

  // A summary sheet: the ten functions on one data set; then the cutoff changes.
  const ten = (cut: number) => async () => {
    jump(s.score, s.outcome, cut);
    takeup(s.score, s.treated, cut);
    effect(s.score, s.treated, s.outcome, cut);
    bandwidth(s.score, s.outcome, cut, s.treated);
    compliercdf(s.score, s.treated, s.outcome, cut, at, 1);
    complierdensity(s.score, s.treated, s.outcome, cut, at, 0);
    await validity(s.score, s.treated, s.outcome, cut);
    densitytest(s.score, cut);
    balance(s.score, s.age, cut);
    bins(s.score, s.outcome, cut);
  };
  forgetAll();
  const sheetCold = await ms(ten(0));
  const afterChange: Time[] = [];
  for (const cut of [0.05, 0.1, -0.05, 0.15, -0.1]) afterChange.push(await ms(ten(cut)));
  const unchanged = await ms(ten(0.15));

  const rows: Array<[string, Time, string]> = [
    ['EFFECT, 100,000 rows, cold (median of 5)', median(coldEffect), '< 50'],
    ['  fastest of 5', fastest(coldEffect), ''],
    ['  first call in the process (compiling too)', firstEffect, ''],
    ['VALIDITY, 100,000 rows, 999 draws, cold (median of 5)', median(coldValidity), '< 500'],
    ['  fastest of 5', fastest(coldValidity), ''],
    ['  first call in the process (compiling too)', firstValidity, ''],
    ['  the engine alone (complierEffect on the columns; median of 5)', median(engineAlone), ''],
    ['    fastest of 5', fastest(engineAlone), ''],
    ['  the functions\' part: recognise and read the three ranges (median of 5)', median(layer), ''],
    ['    fastest of 5', fastest(layer), ''],
    ['  reading the three ranges alone, cell by cell, no cache (median of 5)', median(reading), ''],
    ['EFFECT repeated, unchanged cells in new arrays (median of 15)', median(repeatEffect), '< 1'],
    ['  fastest of 15', fastest(repeatEffect), ''],
    ['  a bare pass over the three ranges\' cells (median of 15)', median(barePass), ''],
    ['    fastest of 15', fastest(barePass), ''],
    ['VALIDITY repeated, unchanged (median of 15)', median(repeatValidity), '< 1'],
    ['  fastest of 15', fastest(repeatValidity), ''],
    ['ten functions of a summary sheet, cold', sheetCold, ''],
    ['ten functions after a cutoff change (median of 5)', median(afterChange), '< 1000'],
    ['  fastest of 5', fastest(afterChange), ''],
    ['ten functions, nothing changed', unchanged, ''],
  ];
  const load = os.loadavg()[0];
  process.stdout.write(`\nworksheet functions on Excel-shaped ranges (${N.toLocaleString('en')} rows); ms; load average ${load.toFixed(1)} on ${os.cpus().length} cores\n`);
  process.stdout.write(`  ${''.padEnd(64)} ${'wall'.padStart(8)} ${'cpu'.padStart(8)}\n`);
  for (const [label, v, target] of rows) {
    process.stdout.write(`  ${label.padEnd(64)} ${fmt(v.wall).padStart(8)} ${fmt(v.cpu).padStart(8)}  ${target ? `target ${target}` : ''}\n`);
  }
}

void main();
