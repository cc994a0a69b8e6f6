/**
 * Kernels of docs/methods.md §2.1, zero outside the open interval (−1, 1).
 *
 * @example kernelWeight('triangular', 0.25) // 0.75
 */
import { CutlineError } from '../errors';

export type KernelName = 'triangular' | 'epanechnikov' | 'uniform';

export const KERNEL_NAMES: readonly KernelName[] = ['triangular', 'epanechnikov', 'uniform'];

/** K(u) for the named kernel. */
export function kernelWeight(kernel: KernelName, u: number): number {
  const a = Math.abs(u);
  if (!(a < 1)) return 0;
  switch (kernel) {
    case 'triangular':
      return 1 - a;
    case 'epanechnikov':
      return 0.75 * (1 - u * u);
    case 'uniform':
      return 0.5;
    default:
      throw new CutlineError(`unknown kernel "${String(kernel)}"`, { code: 'option', argument: 'kernel' });
  }
}

/**
 * One-sided kernel moments ∫₀¹ K(u) uʲ du and ∫₀¹ K(u)² uʲ du in closed form;
 * the bandwidth constants of bandwidthConstants.ts are built from them.
 */
export function kernelMoment(kernel: KernelName, j: number, squared = false): number {
  switch (kernel) {
    case 'uniform':
      return (squared ? 0.25 : 0.5) / (j + 1);
    case 'triangular':
      // ∫(1−u)uʲ = 1/((j+1)(j+2)); ∫(1−u)²uʲ = 2/((j+1)(j+2)(j+3)).
      return squared ? 2 / ((j + 1) * (j + 2) * (j + 3)) : 1 / ((j + 1) * (j + 2));
    case 'epanechnikov': {
      // ∫0.75(1−u²)uʲ = 0.75(1/(j+1) − 1/(j+3)); squared: 0.5625(1/(j+1) − 2/(j+3) + 1/(j+5)).
      if (!squared) return 0.75 * (1 / (j + 1) - 1 / (j + 3));
      return 0.5625 * (1 / (j + 1) - 2 / (j + 3) + 1 / (j + 5));
    }
    default:
      throw new CutlineError(`unknown kernel "${String(kernel)}"`, { code: 'option', argument: 'kernel' });
  }
}
