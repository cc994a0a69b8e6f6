/**
 * Writes the invented demo data of DESIGN.md: a city energy-retrofit rebate.
 * Households whose assessed energy-burden score is 60 or more are offered a
 * rebate; take-up is voluntary and some households below 60 get a retrofit
 * anyway. Nothing here is real. Fixed seed: the files are identical on every run.
 *
 * True effects (for compliers, and for everyone: effects are homogeneous):
 *   heating_bill: −180 (currency units, next winter)
 *   arrears (fell behind on utility payments, 0/1): −0.06 in probability
 * Take-up: about 0.17 just below 60, about 0.68 just above (jump ≈ 0.5).
 *
 */
import { Random } from '../src/engine/numeric/random';

export const TRUE_BILL_EFFECT = -180;
export const TRUE_ARREARS_EFFECT = -0.06;

export interface Household {
  id: number;
  neighbourhood: string;
  energy_burden: number;
  dwelling_age: number;
  household_size: number;
  retrofit: number;
  heating_bill: number | null;
  arrears: number;
}

export function generate(n = 6000, seed = 20261201): Household[] {
  const rng = new Random(seed);
  const hoodEffect = Array.from({ length: 40 }, () => 60 * rng.normal());
  const out: Household[] = [];
  for (let id = 1; id <= n; id++) {
    const hood = rng.integer(40);
    const score = Math.min(100, Math.max(0, 55 + 14 * rng.normal()));
    const burden = Math.round(score * 10) / 10;
    const age = Math.max(2, Math.round(45 + 0.4 * (burden - 55) + 20 * rng.normal()));
    const size = 1 + Math.min(6, Math.floor(-Math.log(1 - rng.uniform()) * 1.6));
    const eligible = burden >= 60;
    const pTake = eligible ? 0.68 + 0.004 * (burden - 60) : 0.17 + 0.003 * (burden - 60);
    const retrofit = rng.uniform() < Math.min(0.95, Math.max(0.02, pTake)) ? 1 : 0;
    const bill =
      1450 + 9 * (burden - 60) + 0.05 * (burden - 60) ** 2 + 2.5 * age + 35 * size + hoodEffect[hood] +
      TRUE_BILL_EFFECT * retrofit + 140 * rng.normal();
    const pArrears = Math.min(0.9, Math.max(0.01, 0.14 + 0.003 * (burden - 60) + TRUE_ARREARS_EFFECT * retrofit));
    out.push({
      id,
      neighbourhood: `N${String(hood + 1).padStart(2, '0')}`,
      energy_burden: burden,
      dwelling_age: age,
      household_size: size,
      retrofit,
      heating_bill: Math.round(bill * 100) / 100,
      arrears: rng.uniform() < pArrears ? 1 : 0,
    });
  }
  // A few unreadable meter reads, left blank or marked NA: Cutline drops them and says how many.
  for (let k = 0; k < 14; k++) out[rng.integer(n)].heating_bill = null;
  return out;
}

export const COLUMNS: (keyof Household)[] = ['id', 'neighbourhood', 'energy_burden', 'retrofit', 'heating_bill', 'arrears', 'dwelling_age', 'household_size'];

export function cell(h: Household, c: keyof Household, k: number): string {
  const v = h[c];
  if (v === null) return k % 2 === 0 ? '' : 'NA';
  return typeof v === 'number' && c === 'heating_bill' ? v.toFixed(2) : String(v);
}

