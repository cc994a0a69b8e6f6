/**
 * Chart specifications of a summary (summaryTypes.ts ChartSpec), read off a
 * check's result: take-up, each outcome and each covariate against the score
 * (binned means and the local linear fit lines), the implied complier
 * distributions (falling stretches marked), the score's histogram around the
 * cutoff (the counts of the take-up bins, which lie over the score's range),
 * and the validity p-value across the sensitivity bandwidths.
 *
 * @example buildCharts(runCheck(input, { cutoff: 60, bins: true }), 'retrofit').map((c) => c.id)
 */
import type { BinnedSeries, CheckResult } from '../engine';
import { num, pIs } from './numberText';
import { ChartSpec } from './summaryTypes';

function fitPoints(b: BinnedSeries, side: 'below' | 'above', cutoff: number): Array<{ x: number; y: number }> {
  const f = b.fit[side];
  return [f.from, f.to].map((x) => ({ x, y: f.intercept + f.slope * (x - cutoff) }));
}

function binnedChart(r: CheckResult, b: BinnedSeries, takeup: boolean): ChartSpec {
  const what = takeup ? `Share treated (${b.name})` : b.name;
  return {
    id: `bins:${b.name}`,
    title: takeup ? 'Take-up against the score' : `${b.name} against the score`,
    xLabel: 'score',
    yLabel: takeup ? `share treated (${b.name})` : `mean ${b.name}`,
    alt:
      `${what} averaged in ${b.bins.length} bins of the score (${b.bins_below} laid below the cutoff ${r.cutoff}, ${b.bins_above} above), ` +
      `with local linear fit lines within the bandwidth ${num(r.bandwidth.value)} on each side: at the cutoff the fit is ${num(b.fit.below.intercept)} below and ${num(b.fit.above.intercept)} above.`,
    points: b.bins.map((x) => ({ x: x.midpoint, y: x.mean, count: x.count })),
    lines: [
      { label: 'fit below', points: fitPoints(b, 'below', r.cutoff) },
      { label: 'fit above', points: fitPoints(b, 'above', r.cutoff) },
    ],
    verticals: [{ x: r.cutoff, label: `cutoff ${r.cutoff}` }],
    yDomain: takeup ? [0, 1] : undefined,
    table: `bins:${b.name}`,
  };
}

export function buildCharts(r: CheckResult, treatedName: string): ChartSpec[] {
  const charts: ChartSpec[] = [];
  const bins = r.bins ?? [];
  for (const b of bins) charts.push(binnedChart(r, b, b.name === treatedName));
  for (const o of r.outcomes) {
    const c = o.compliers;
    if (!c) continue;
    const stretches = [
      ...c.decreasing_treated.map((s) => ({ x0: s.from, x1: s.to, label: 'treated CDF falls' })),
      ...c.decreasing_untreated.map((s) => ({ x0: s.from, x1: s.to, label: 'untreated CDF falls' })),
    ];
    charts.push({
      id: `compliers:${o.name}`,
      title: `Implied distributions of compliers' ${o.name}`,
      xLabel: o.name,
      yLabel: 'cumulative share of compliers',
      alt:
        `Implied cumulative distributions of ${o.name} for treated and untreated compliers at ${c.at.length} values; means ${num(c.mean_treated)} treated and ${num(c.mean_untreated)} untreated. ` +
        (stretches.length ? `${stretches.length} stretch${stretches.length > 1 ? 'es' : ''} where a distribution falls ${stretches.length > 1 ? 'are' : 'is'} shaded: a probability cannot fall, so this pictures a violation or noise.` : 'Neither distribution falls anywhere.'),
      lines: [
        { label: 'treated compliers', points: c.at.map((x, i) => ({ x, y: c.cdf_treated[i] })), step: true },
        { label: 'untreated compliers', points: c.at.map((x, i) => ({ x, y: c.cdf_untreated[i] })), step: true, dashed: true },
      ],
      stretches,
      // A distribution runs from 0 to 1; an implied one may overshoot a little.
      yDomain: [Math.min(0, ...c.cdf_treated, ...c.cdf_untreated), Math.max(1, ...c.cdf_treated, ...c.cdf_untreated)],
      table: `compliers:${o.name}`,
    });
  }
  const tk = bins.find((b) => b.name === treatedName);
  if (tk) {
    // Heights per unit of score: the bins are evenly spaced on each side, but not equally wide across the cutoff.
    const bars = tk.bins.map((x) => ({ x0: x.from, x1: x.to, y: x.count / (x.to - x.from), count: x.count }));
    charts.push({
      id: 'histogram',
      title: 'Scores around the cutoff',
      xLabel: 'score',
      yLabel: 'units per score unit',
      alt: `Histogram of the score in ${bars.length} non-empty bins (${tk.bins_below} laid below the cutoff ${r.cutoff}, ${tk.bins_above} above); a pile-up just on one side would suggest sorting. Density test ${r.density?.pvalue !== undefined ? pIs(r.density.pvalue) : 'p not computed'}.`,
      bars,
      verticals: [{ x: r.cutoff, label: `cutoff ${r.cutoff}` }],
      table: `bins:${tk.name}`,
    });
  }
  const curves = r.outcomes
    .map((o) => ({ label: o.name, points: (o.validity.by_bandwidth ?? []).filter((b) => b.pvalue !== undefined).map((b) => ({ x: b.bandwidth, y: b.pvalue! })) }))
    .filter((l) => l.points.length > 0);
  if (curves.length > 0) {
    charts.push({
      id: 'sensitivity',
      title: 'Outcome–treatment test across bandwidths',
      xLabel: 'bandwidth (score units)',
      yLabel: 'p-value',
      alt:
        `P-value of the outcome–treatment test (the headline: the larger of its observed and trend-removed versions) at ${curves[0].points.length} bandwidths around the test bandwidth ${num(r.test_bandwidth.value)}, one line per outcome (${curves.map((c) => c.label).join(', ')}); ` +
        'points below the dashed 0.05 line reject the design at that bandwidth.',
      lines: curves,
      horizontals: [{ y: 0.05, label: '0.05' }],
      verticals: [{ x: r.test_bandwidth.value, label: 'test bandwidth' }],
      yDomain: [0, 1],
      table: 'sensitivity',
    });
  }
  return charts;
}
