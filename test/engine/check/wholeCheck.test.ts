// The whole check in process on the demo data: runCheck's result, put into the JSON document
// by the command line's writer, equals byte for byte the committed output of `cutline check
// --json` (test/fixtures/cli/demo.json, made by the command as a separate process).
import * as fs from 'fs';
import * as path from 'path';
import { runCheck } from '../../../src/engine';
import { toJson } from '../../../src/cli/json';
import { demoInput, DEMO_CUTOFF } from '../../helpers/demo';

test('runCheck on the demo gives the committed JSON of `cutline check --json`', () => {
  const input = demoInput({ outcomes: ['heating_bill', 'arrears'], covariates: ['dwelling_age', 'household_size'], cluster: true });
  const r = runCheck(input, { cutoff: DEMO_CUTOFF, variance: 'cluster' });
  const expected = fs.readFileSync(path.join(__dirname, '..', '..', 'fixtures', 'cli', 'demo.json'), 'utf8');
  expect(JSON.stringify(toJson(r), null, 2) + '\n').toBe(expected);
});

test('every outcome line divides out: effect = jump / that outcome’s own take-up, to the last digit (demo: heating_bill misses 14 values)', () => {
  const input = demoInput({ outcomes: ['heating_bill', 'arrears'] });
  const r = runCheck(input, { cutoff: DEMO_CUTOFF, draws: 19, sensitivity: [] });
  for (const o of r.outcomes) expect(o.effect.estimate).toBe(o.jump.estimate / o.takeup.estimate);
  // The first stage on its own rows differs from heating_bill's (the 0.48885 vs 0.48783).
  expect(r.takeup.estimate).not.toBe(r.outcomes[0].takeup.estimate);
  expect(r.takeup_rows).toEqual({ used: 6000, dropped: 0 });
  expect(r.outcomes[0].rows).toEqual({ used: 5986, dropped: 14 });
});
