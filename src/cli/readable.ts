/**
 * The readable (default) output of `cutline check`: Cutline's own layout, a
 * block per question an evaluator asks, with the cautions of docs/methods.md.
 */
import { CheckResult, EstimateSummary, OutcomeResult, ValidityReport, ValidityResult } from '../engine';
import { CAUTION } from '../report/cautions';
import { interval, num, padLeft, padRight, pIs, pval, wrap } from './format';

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

/** The summary's cautions (src/report/cautions.ts) that hold for every check; the others are said where they apply. */
const GENERAL_CAUTIONS = [CAUTION.notProof, CAUTION.judgement];

function armName(arm: 0 | 1): string {
  return arm === 1 ? 'treated compliers' : 'untreated compliers';
}

function armRestrictions(arm: 0 | 1): string {
  return arm === 1 ? 'treated-arm restrictions' : 'untreated-arm restrictions';
}

/** One version's numbers and worst interval; `units` says how to read the interval's ends. */
function versionLines(title: string, v: ValidityResult, within: string | undefined, units: string): string[] {
  const w = v.worst;
  const cell = w.cell !== undefined ? ` in the cell ${within} = ${w.cell_label ?? w.cell}` : '';
  return [
    `  ${title}: ${pIs(v.pvalue)}; statistic ${num(v.statistic)}, 5% critical value ${num(v.critical_value)}, ${v.intervals} intervals`,
    `    worst interval (largest t): ${armName(w.arm)}, outcomes from ${num(w.from)} to ${num(w.to)}${units}${cell} (t = ${num(w.t)})`,
  ];
}

function decidedBy(v: ValidityReport): string {
  if (v.guard === 'off') return 'The trend guard is off (--trend-guard off), so the headline is the published test on the observed outcomes';
  if (v.guard === 'few outcome values')
    return (
      'The outcome takes few distinct values in the window (no more than the grid size), so the trend guard does not apply ' +
      'and the headline is the published test on the observed outcomes'
    );
  const which =
    v.decided_by === 'both'
      ? 'Decided by both versions alike (they give the same p-value)'
      : v.decided_by === 'trend_adjusted'
        ? 'Decided by the version with the trend removed (its p-value is the larger)'
        : 'Decided by the version on the observed outcomes (its p-value is the larger)';
  return `${which}; the headline p-value is the larger of the two, so the design is rejected only when both versions reject`;
}

function validityBlock(o: OutcomeResult): string[] {
  const v = o.validity;
  const lines: string[] = [];
  const within = v.within ? ` (within cells of ${v.within})` : '';
  if (!v.applicable) {
    lines.push(`${o.name}${within}: no test run`);
    lines.push(`  ${wrap(`Why: ${v.reason}.`, 96, '  ')}`);
    return lines;
  }
  const verdict = v.rejects ? 'the data contradict the design at 5%' : 'the data do not contradict the design at 5%';
  const holm = v.pvalue_holm !== undefined && v.pvalue_holm !== v.pvalue ? `, Holm-adjusted ${pval(v.pvalue_holm)}` : '';
  lines.push(`${o.name}${within}: ${verdict} (${pIs(v.pvalue)}${holm})`);
  lines.push(`  ${wrap(decidedBy(v), 96, '  ')}`);
  const ob = v.observed;
  lines.push(...versionLines('observed outcomes (the published test)', ob, v.within, ''));
  if (v.trend_adjusted)
    lines.push(
      ...versionLines(
        "outcomes with each side's quadratic trend in the score removed",
        v.trend_adjusted,
        v.within,
        ' in outcome units at the cutoff',
      ),
    );
  for (const a of ob.left_out) {
    const cell = a.cell !== undefined ? ` in the cell ${v.within} = ${a.cell_label ?? a.cell}` : '';
    lines.push(`  ${wrap(`left out${cell}: the ${armRestrictions(a.arm)}, because ${a.reason}.`, 96, '    ')}`);
  }
  lines.push(`  ${ob.draws} draws (seed ${ob.seed}); ${ob.counts.below} below / ${ob.counts.above} above in the window`);
  if (v.by_bandwidth.length > 1) {
    const guarded = v.by_bandwidth.some((b) => b.pvalue_trend_adjusted !== undefined);
    lines.push(
      padRight('  by bandwidth', 20) + padLeft('p', 6) + (guarded ? `${padLeft('observed', 11)}${padLeft('trend removed', 15)}` : ''),
    );
    for (const b of v.by_bandwidth) {
      const label = padRight(`    ×${b.multiple} (${num(b.bandwidth, 3)})`, 20);
      if (b.error !== undefined) lines.push(`${label}  cannot run: ${b.error}`);
      else if (b.applicable === false) lines.push(`${label}  not applicable: the design is sharp in this window`);
      else {
        const extra = guarded
          ? `${padLeft(pval(b.pvalue_observed!), 11)}${padLeft(b.pvalue_trend_adjusted === undefined ? '–' : pval(b.pvalue_trend_adjusted), 15)}`
          : '';
        lines.push(`${label}${padLeft(pval(b.pvalue!), 6)}${extra}${b.rejects ? '   rejects at 5%' : ''}`);
      }
    }
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
  const unreliable = d.method === 'none' ? ' [not reliable here: mass points]' : '';
  if (d.local_polynomial) {
    const l = d.local_polynomial;
    lines.push(
      `  local polynomial (Cattaneo, Jansson & Ma 2020)${d.method === 'local_polynomial' ? ' [headline]' : unreliable}: ` +
        `densities ${num(l.density_below)} below, ${num(l.density_above)} above; log ratio ${num(l.log_ratio)} (se ${num(l.se)}), ${pIs(l.pvalue)}; bandwidth ${num(l.bandwidth)}`,
    );
  }
  if (d.mccrary) {
    const m = d.mccrary;
    lines.push(
      `  McCrary (2008)${d.method === 'mccrary' ? ' [headline]' : unreliable}: densities ${num(m.density_below)} below, ${num(m.density_above)} above; ` +
        `log ratio ${num(m.log_ratio)} (se ${num(m.se)}), ${pIs(m.pvalue)}; bin ${num(m.bin)}, bandwidth ${num(m.bandwidth)}`,
    );
  }
  if (d.method === 'none') lines.push(`  ${wrap(`No density test is shown as the headline: ${d.unreliable}.`, 96, '  ')}`);
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
    out.push(`${o.name}  (${o.rows.used} rows with a score, treatment and ${o.name})`);
    out.push(row('  take-up jump, these rows', o.takeup));
    out.push(row('  jump at the cutoff', o.jump));
    out.push(row('  effect for compliers', o.effect));
  }
  out.push('');
  out.push('p: two-sided, robust bias-corrected. Jumps are eligible side minus the other side.');
  out.push(
    wrap(
      `The first-stage take-up uses the ${r.takeup_rows.used} rows with a score and treatment; each outcome's effect is its jump ` +
        'divided by the take-up jump on its own rows.',
      96,
      '',
    ),
  );
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
