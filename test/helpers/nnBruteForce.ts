/**
 * The nn residual rule of README "Estimates" written out unit by unit, O(n²):
 * for unit i the distances to every other unit of the side, the J-th smallest
 * d (all others when the side has J or fewer), every unit within d·(1 + 1e-12),
 * and e_i = sqrt(K/(K+1))·(V_i − their mean), K their count. The reference for
 * src/engine/fit/residuals.ts's grouped computation.
 */
export function nnBruteForce(x: ArrayLike<number>, v: ArrayLike<number>, J = 3): Float64Array {
  const n = x.length;
  const e = new Float64Array(n);
  const jj = Math.min(J, n - 1);
  for (let i = 0; i < n; i++) {
    if (jj <= 0) continue;
    const d: number[] = [];
    for (let j = 0; j < n; j++) if (j !== i) d.push(Math.abs(x[j] - x[i]));
    d.sort((a, b) => a - b);
    const reach = d[jj - 1] + d[jj - 1] * 1e-12;
    let sum = 0;
    let count = 0;
    for (let j = 0; j < n; j++) {
      if (j !== i && Math.abs(x[j] - x[i]) <= reach) {
        sum += v[j];
        count++;
      }
    }
    e[i] = Math.sqrt(count / (count + 1)) * (v[i] - sum / count);
  }
  return e;
}
