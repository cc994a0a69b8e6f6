/**
 * validityTest for tests that expect the test to run: returns the result of
 * an applicable test and fails loudly (with the engine's reason) otherwise.
 */
import { validityTest, ValidityResult } from '../../src/engine/validity/validityTest';

export function ranTest(...args: Parameters<typeof validityTest>): ValidityResult {
  const r = validityTest(...args);
  if (!r.applicable) throw new Error(`expected the validity test to run, but: ${r.reason}`);
  return r;
}
