/**
 * The readable (default) output of `cutline check`: Cutline's own layout, a
 * block per question an evaluator asks, with the cautions of docs/methods.md.
 */
import { CheckResult, EstimateSummary, OutcomeResult } from '../engine/check/check';
import { interval, num, padLeft, padRight, pval, wrap } from './format';

const COLS = [28, 12, 11, 26, 26, 9];

function row(label: string, e: EstimateSummary): string {
  return [
    padRight(label, COLS[0]),
    padLeft(num(e.estimate), COLS[1]),
    padLeft(num(e.se), COLS[2]),
    padLeft(interval(e.ci), COLS[3]),
    padLeft(interval(e.ci_robust), COLS[4]),
    padLeft(pval(e.pvalue), COLS[5]),
  ].join('');
}

function header(): string {
  return [
    padRight('', COLS[0]),
    padLeft('estimate', COLS[1]),
    padLeft('std. err.', COLS[2]),
    padLeft('95% interval', COLS[3]),
    padLeft('robust 95% interval', COLS[4]),
    padLeft('p', COLS[5]),
  ].join('');
}

export const GENERAL_CAUTIONS = [
  'A test that does not reject is not proof that the design is valid: it only finds no contradiction in these data.',
  'Cutline informs, and does not replace, the judgement of a qualified evaluator.',
];

function armName(arm: 0 | 1): string {
  return arm === 1 ? 'treated compliers' : 'untreated compliers';
}

function validityBlock(o: OutcomeResult): string[] {
  const v = o.validity;
  const lines: string[] = [];
  const verdict = v.rejects ? 'the data contradict the design at 5%' : 'the data do not contradict the design at 5%';
  const holm = v.pvalue_holm !== v.pvalue ? `, Holm-adjusted ${pval(v.pvalue_holm)}` : '';
  lines.push(`${o.name}${v.within ? ` (within cells of ${v.within})` : ''}: ${verdict} (p = ${pval(v.pvalue)}${holm})`);
  lines.push(
    `  statistic ${num(v.statistic)}, 5% critical value ${num(v.critical_value)}, ${v.intervals} intervals, ${v.draws} draws (seed ${v.seed}), ` +
      `${v.window.below} below / ${v.window.above} above in the window`,
  );
  const cell = v.worst.cell !== undefined ? ` in the cell ${v.within} = ${v.worst.cell_label ?? v.worst.cell}` : '';
  lines.push(
    `  worst interval (largest t): ${armName(v.worst.arm)}, outcomes from ${num(v.worst.from)} to ${num(v.worst.to)}${cell} (t = ${num(v.worst.t)})`,
  );
  if (v.by_bandwidth.length > 1) {
    const cells = v.by_bandwidth.map((b) =>
      b.error !== undefined ? `×${b.multiple}: cannot run` : `×${b.multiple} (${num(b.bandwidth, 3)}): p ${pval(b.pvalue!)}${b.rejects ? ' reject' : ''}`,
    );
    lines.push(`  by bandwidth: ${cells.join('; ')}`);
  }
  if (o.compliers) {
    lines.push(`  complier means: treated ${num(o.compliers.mean_treated)}, untreated ${num(o.compliers.mean_untreated)}`);
  }
  return lines;
}

function densityBlock(r: CheckResult): string[] {
  const d = r.density;
  if (!d) return [];
  const lines = ['', 'Did units sort themselves across the cutoff? Density of the score'];
  if (d.local_polynomial) {
    const l = d.local_polynomial;
    lines.push(
      `  local polynomial (Cattaneo, Jansson & Ma 2020)${d.method === 'local_polynomial' ? ' [headline]' : ''}: ` +
        `densities ${num(l.density_below)} below, ${num(l.density_above)} above; log ratio ${num(l.log_ratio)} (se ${num(l.se)}), p = ${pval(l.pvalue)}; bandwidth ${num(l.bandwidth)}`,
    );
  }
  if (d.mccrary) {
    const m = d.mccrary;
    lines.push(
      `  McCrary (2008)${d.method === 'mccrary' ? ' [headline]' : ''}: densities ${num(m.density_below)} below, ${num(m.density_above)} above; ` +
        `log ratio ${num(m.log_ratio)} (se ${num(m.se)}), p = ${pval(m.pvalue)}; bin ${num(m.bin)}, bandwidth ${num(m.bandwidth)}`,
    );
  }
  lines.push(`  ${wrap(d.caution, 96, '  ')}`);
  return lines;
}

function balanceBlock(r: CheckResult): string[] {
  if (!r.balance || r.balance.length === 0) return [];
  const lines = ['', 'Do pre-treatment characteristics jump at the cutoff? (Holm-adjusted across covariates)'];
  lines.push(
    [padRight('', 26), padLeft('jump', 12), padLeft('p', 9), padLeft('p Holm', 9), padLeft('perm. p', 9), padLeft('perm. Holm', 12), padLeft('q', 7)].join(''),
  );
  for (const b of r.balance) {
    const f = (v: number | undefined): string => (v === undefined ? '–' : pval(v));
    lines.push(
      [
        padRight(`  ${b.name}`, 26),
        padLeft(b.jump === undefined ? '–' : num(b.jump), 12),
        padLeft(f(b.pvalue), 9),
        padLeft(f(b.pvalue_holm), 9),
        padLeft(f(b.permutation_pvalue), 9),
        padLeft(f(b.permutation_pvalue_holm), 12),
        padLeft(b.q === undefined ? '–' : String(b.q), 7),
      ].join(''),
    );
  }
  lines.push('  p: robust local linear jump; perm. p: Canay & Kamat (2018) permutation test of the q units nearest the cutoff on each side.');
  return lines;
}

export function readable(file: string, r: CheckResult): string {
  const out: string[] = [];
  const side = r.eligible === 'above' ? `score ≥ ${r.cutoff}` : `score < ${r.cutoff}`;
  out.push(`Cutline check of ${file}`);
  out.push(`Cutoff ${r.cutoff}; eligible units: ${side}`);
  out.push(
    `Rows: ${r.rows.read} read, ${r.rows.used} used, ${r.rows.dropped} dropped for missing values` +
      (r.donut ? `; ${r.donut.excluded} rows with |score − ${r.cutoff}| < ${r.donut.radius} left out of every estimate and test (donut)` : ''),
  );
  out.push(
    `Bandwidth ${num(r.bandwidth.value)} (${r.bandwidth.rule === 'typed' ? 'typed' : `rule ${r.bandwidth.rule}`}, ` +
      `${r.bandwidth.kernel} kernel, ${r.bandwidth.variance} variance): ${r.bandwidth.window.below} units below, ${r.bandwidth.window.above} above`,
  );
  out.push('');
  out.push(header());
  out.push(row('Take-up jump (first stage)', r.takeup));
  for (const o of r.outcomes) {
    out.push(`${o.name}${o.rows.dropped > r.rows.dropped ? `  (${o.rows.used} rows used)` : ''}`);
    out.push(row('  jump at the cutoff', o.jump));
    out.push(row('  effect for compliers', o.effect));
  }
  out.push('');
  out.push('p: two-sided, robust bias-corrected. Jumps are eligible side minus the other side.');
  out.push('');
  out.push(
    `Do the data contradict the design? Outcome–treatment test (Arai et al. 2022) at bandwidth ${num(r.test_bandwidth.value)} ` +
      `(${r.test_bandwidth.rule})`,
  );
  for (const o of r.outcomes) out.push(...validityBlock(o));
  out.push(...densityBlock(r));
  out.push(...balanceBlock(r));
  const warnings = [
    ...r.warnings,
    ...r.outcomes.flatMap((o) => o.warnings.map((w) => `${o.name}: ${w}`)),
    ...(r.density?.warnings ?? []).map((w) => `density: ${w}`),
    ...(r.balance ?? []).flatMap((b) => b.warnings.map((w) => `${b.name}: ${w}`)),
  ];
  if (warnings.length > 0) {
    out.push('');
    out.push('Warnings');
    for (const w of warnings) out.push(`  - ${wrap(w, 96, '    ')}`);
  }
  out.push('');
  out.push('Cautions');
  for (const c of GENERAL_CAUTIONS) out.push(`  - ${wrap(c, 96, '    ')}`);
  return out.join('\n') + '\n';
}
