/**
 * Warnings about a design whose clusters cannot carry a clustered variance
 * (README "Estimates"), from the units of the estimates' window:
 *
 * - fewer than FEW_CLUSTERS clusters in the window: cluster-robust standard
 *   errors with the G/(G − 1) factor are known to be too small, and tests to
 *   over-reject, with few clusters (Cameron & Miller 2015, "A practitioner's
 *   guide to cluster-robust inference", J. Human Resources 50(2), §VI —
 *   recalled from memory: problems below roughly 20–50 clusters); Cutline
 *   warns below 20, the lower end;
 * - a side of the window whose units all belong to one cluster: a local fit's
 *   residuals, weighted by its own weights, sum to zero, so that side adds
 *   nothing to the clustered variance, and with one cluster on each side
 *   (clusters coinciding with the sides of the cutoff) the standard errors
 *   are about 0.
 *
 * Example: clusters [0,0,0 | 1,1,1] below/above give the one-cluster warning
 * for both sides and the few-clusters warning (2 clusters).
 */
export const FEW_CLUSTERS = 20;

export function clusterWarnings(
  clusters: ArrayLike<number>,
  below: ArrayLike<number>,
  above: ArrayLike<number>,
  labels: readonly string[],
  name: string,
): string[] {
  const warnings: string[] = [];
  const all = new Set<number>();
  const sides: Array<[string, ArrayLike<number>]> = [
    ['below', below],
    ['above', above],
  ];
  const single: string[] = [];
  for (const [side, index] of sides) {
    const seen = new Set<number>();
    for (let t = 0; t < index.length; t++) {
      seen.add(clusters[index[t]]);
      all.add(clusters[index[t]]);
    }
    if (seen.size === 1 && index.length > 0) single.push(`${side} the cutoff all belong to the cluster ${JSON.stringify(labels[[...seen][0]] ?? '')}`);
  }
  if (single.length > 0) {
    warnings.push(
      `the units in the window ${single.join(', and those ')} of the cluster column "${name}": a side with one cluster adds nothing to the clustered variance, ` +
        'so the standard errors are far too small (about 0 when each side is one cluster); use clusters that vary within each side, or the nn variance',
    );
  }
  if (all.size < FEW_CLUSTERS) {
    warnings.push(
      `the window holds only ${all.size} cluster${all.size === 1 ? '' : 's'} of "${name}" (fewer than ${FEW_CLUSTERS}): clustered standard errors are too small with few clusters, ` +
        'so treat the intervals and p-values as optimistic',
    );
  }
  return warnings;
}
