/**
 * Limits of the validity test's whole-number options, the one place they are
 * written: the engine refuses values outside them (validityTest.ts), and every
 * face (command line, task pane) checks typed values against them, so all
 * accept and refuse the same boundaries. Beyond the upper limits a check runs
 * for hours or exhausts memory (draws × intervals; grid² intervals); the seed
 * is a 32-bit unsigned integer (the random stream's state, numeric/random.ts).
 *
 * @example
 *   limitProblem('draws', 0)      // 'must be a whole number of at least 1'
 *   limitProblem('seed', 2 ** 32) // 'must be a whole number from 0 to 4294967295'
 *   limitProblem('grid', 30)      // null
 */
export interface WholeLimit {
  min: number;
  max: number;
  /** Why there is an upper limit, when it is a cap rather than the range of the option. */
  beyond?: string;
}

export const VALIDITY_LIMITS: Readonly<Record<'draws' | 'seed' | 'grid', WholeLimit>> = {
  draws: { min: 1, max: 100000, beyond: 'more draws only slow the check down' },
  seed: { min: 0, max: 4294967295 },
  grid: { min: 2, max: 1000, beyond: 'the intervals grow as its square' },
};

export const MAX_DRAWS = VALIDITY_LIMITS.draws.max;
export const MAX_GRID = VALIDITY_LIMITS.grid.max;

/** What is wrong with `v` for the option (to follow its name), or null when it is within the limits. */
export function limitProblem(option: keyof typeof VALIDITY_LIMITS, v: number): string | null {
  const { min, max, beyond } = VALIDITY_LIMITS[option];
  if (beyond === undefined) return Number.isInteger(v) && v >= min && v <= max ? null : `must be a whole number from ${min} to ${max}`;
  if (!Number.isInteger(v) || v < min) return `must be a whole number of at least ${min}`;
  return v > max ? `must be at most ${max} (${beyond})` : null;
}
