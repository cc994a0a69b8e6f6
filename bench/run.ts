/**
 * `npm run bench`: every benchmark in turn, each in its own process so that
 * memory and timings do not leak between them. `npm run bench -- --quick`
 * runs the Monte Carlo studies with fewer replications.
 */
import { spawnSync } from 'child_process';
import * as path from 'path';

const quick = process.argv.includes('--quick');
const runner = path.join(process.cwd(), 'bin', 'run-ts.cjs');
const benches: Array<[string, string[]]> = [
  ['bench/checkBench.ts', []],
  ['bench/tiesBench.ts', []],
  ['bench/validityBench.ts', []],
  ['bench/densityBench.ts', []],
  ['bench/functionsBench.ts', []],
  ['bench/batchBench.ts', quick ? ['8', '1000'] : []],
  ['bench/validityMonteCarlo.ts', quick ? ['--quick'] : []],
  ['bench/densityMonteCarlo.ts', [quick ? '400' : '2000']],
  ['bench/validitySizeBinding.ts', [quick ? '200' : '2000']],
  ['bench/bandwidthConvergence.ts', [quick ? '50' : '400']],
  ['bench/densitySpread.ts', [quick ? '200' : '2000']],
];
let failed = 0;
for (const [file, args] of benches) {
  process.stdout.write(`\n=== ${file} ${args.join(' ')}\n`);
  const r = spawnSync(process.execPath, [runner, file, ...args], { stdio: 'inherit' });
  if (r.status !== 0) failed++;
}
process.exitCode = failed > 0 ? 1 : 0;
