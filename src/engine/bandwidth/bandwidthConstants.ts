/**
 * Kernel constants of local polynomial regression at a boundary (Fan &
 * Gijbels 1996, §3.2.4). With one-sided moments μ_j = ∫₀¹ K uʲ, ψ_j = ∫₀¹ K² uʲ,
 * Γ = [μ_{a+b}], Λ = [μ_{p+1+a}], Ψ = [ψ_{a+b}] (a, b = 0..p):
 *
 *   B_ν = e_ν'Γ⁻¹Λ (bias), V_ν = e_ν'Γ⁻¹ΨΓ⁻¹e_ν (variance),
 *
 * and the MSE-optimal bandwidth for the ν-th derivative with a degree-p fit is
 * C·[σ²/(f·(m^(p+1))²)]^(1/(2p+3))·n^(−1/(2p+3)) with
 * C = [(2ν+1)·(p+1)!²·V_ν / (2(p+1−ν)·B_ν²)]^(1/(2p+3)).
 * For the triangular kernel, ν = 0, p = 1 this gives 3.4375, the C_K of
 * Imbens & Kalyanaraman (2012) (checked in test/bandwidthConstants.test.ts).
 */
import { KernelName, kernelMoment } from '../fit';
import { invertSmall } from '../numeric';

export interface KernelConstants {
  bias: number;
  variance: number;
  /** The MSE-optimal bandwidth constant C. */
  constant: number;
}

function factorial(k: number): number {
  return k <= 1 ? 1 : k * factorial(k - 1);
}

export function boundaryConstants(kernel: KernelName, p: number, nu: number): KernelConstants {
  const q = p + 1;
  const gamma = Array.from({ length: q }, (_, a) => Array.from({ length: q }, (_, b) => kernelMoment(kernel, a + b)));
  const psi = Array.from({ length: q }, (_, a) => Array.from({ length: q }, (_, b) => kernelMoment(kernel, a + b, true)));
  const inv = invertSmall(gamma)!;
  const row = inv[nu];
  let bias = 0;
  for (let a = 0; a < q; a++) bias += row[a] * kernelMoment(kernel, p + 1 + a);
  let variance = 0;
  for (let a = 0; a < q; a++) for (let b = 0; b < q; b++) variance += row[a] * psi[a][b] * row[b];
  const expo = 1 / (2 * p + 3);
  const constant = Math.pow(
    ((2 * nu + 1) * factorial(p + 1) ** 2 * variance) / (2 * (p + 1 - nu) * bias * bias),
    expo,
  );
  return { bias, variance, constant };
}
