/**
 * Builds the summary model (summaryTypes.ts) from a check's result, the
 * options it ran with and where its data sit in a workbook. Pure: no I/O.
 * Every number is the engine's (CheckResult of runCheck with `bins: true`);
 * this module only places them, pairs each with the CUTLINE.* formula that
 * computes it (formulas.ts), and says in words what they mean.
 *
 * Layout of the summary sheet (1-based rows; columns A…): title, note and
 * source in rows 1–3; the settings block from row 5 (A key, B value,
 * C meaning): cutoff, bandwidth and test bandwidth as named cells passed to
 * each formula, then the option rows that form the `settings` range; the
 * result tables below, one after another, then the tables behind the plots.
 *
 * @example
 *   const r = runCheck(input, { cutoff: 60, bins: true });
 *   const m = buildSummary(r, { source: 'retrofit.csv', data, options: { cutoff: 60 } });
 *   m.tables[0].rows[0][1].formula; // 'CUTLINE.TAKEUP(Data!$A$2:$A$6001, …)'
 */
import { CheckOptions, CheckResult, DEFAULT_SENSITIVITY, EstimateSummary, OutcomeResult, resolveValidityOptions } from '../engine';
import { CAUTIONS } from './cautions';
import * as F from './formulas';
import { num, pIs } from './numberText';
import { buildCharts } from './summaryCharts';
import { CellFormat, Headline, SettingRow, SummaryCell, SummaryModel, SummaryTable, TextBlock, Verdict } from './summaryTypes';

/** Where the data sit: the sheet, its first and last data rows, and each named column's 0-based index. */
export interface DataRanges {
  sheet: string;
  firstRow: number;
  lastRow: number;
  columns: Record<string, number>;
}

export interface SummaryContext {
  source: string;
  data: DataRanges;
  options: CheckOptions;
  /** Sheet names the workbook already has (the summary's name avoids them). */
  takenSheetNames?: string[];
  /** Column names of the roles (as the engine saw them). */
  names: { score: string; treated: string; covariates?: string[] };
}

export const SUMMARY_SHEET = 'Cutline summary';

/** 'Cutline summary', or with ' (2)', ' (3)', … when taken (case-insensitive, as Excel compares). */
export function summarySheetName(taken: string[] = [], base = SUMMARY_SHEET): string {
  const lower = new Set(taken.map((t) => t.toLowerCase()));
  if (!lower.has(base.toLowerCase())) return base;
  for (let k = 2; ; k++) {
    const name = `${base} (${k})`;
    if (!lower.has(name.toLowerCase())) return name;
  }
}

const cell = (value: number | string | null, format: CellFormat = 'number', formula?: string): SummaryCell =>
  formula === undefined ? { value, format } : { value, format, formula };

const text = (s: string): SummaryCell => ({ value: s, format: 'text' });

const SETTINGS_ROW = 5;
/** A chart picture spans this many sheet rows and columns (640 × 400 px at the default sizes). */
export const CHART_ROWS = 21;
export const CHART_COLS = 7;

export function buildSummary(r: CheckResult, ctx: SummaryContext): SummaryModel {
  const { data } = ctx;
  const col = (name: string): string => {
    const k = data.columns[name];
    if (k === undefined) throw new Error(`the summary has no data range for column ${JSON.stringify(name)}`);
    return F.columnRange(data.sheet, k, data.firstRow, data.lastRow);
  };
  const score = col(ctx.names.score);
  const treated = col(ctx.names.treated);
  const v = resolveValidityOptions({ ...ctx.options, bandwidth: r.test_bandwidth.value, kernel: r.bandwidth.kernel });
  const sensitivity = ctx.options.sensitivity ?? DEFAULT_SENSITIVITY;

  // Settings: three named cells passed by position, then the name/value range.
  let row = SETTINGS_ROW + 1;
  const at = (): string => F.cellAddress(row++, 1);
  const cutoffCell = { key: 'cutoff', label: 'Cutoff (score at which eligibility changes)', value: r.cutoff, address: at() } as SettingRow;
  const optionsStart = SETTINGS_ROW + 4;
  const optionsEnd = optionsStart + 10;
  const settingsRange = `${F.cellAddress(optionsStart, 0)}:${F.cellAddress(optionsEnd, 1)}`;
  const firstOutcome = { score, treated, outcome: col(r.outcomes[0].name) };
  const bwCell: SettingRow = {
    key: 'bandwidth',
    label: r.bandwidth.rule === 'typed' ? 'Bandwidth (typed)' : `Bandwidth (rule ${r.bandwidth.rule}, for the effect on ${r.outcomes[0].name})`,
    value: r.bandwidth.value,
    address: at(),
  };
  if (r.bandwidth.rule !== 'typed') bwCell.formula = F.bandwidth(firstOutcome, { cutoff: cutoffCell.address, settings: settingsRange });
  const testCell: SettingRow = {
    key: 'test_bandwidth',
    label: `Bandwidth of the outcome–treatment test (${r.test_bandwidth.rule})`,
    value: r.test_bandwidth.value,
    address: at(),
  };
  if (r.test_bandwidth.rule !== 'typed') {
    testCell.formula = F.testBandwidth(firstOutcome, { cutoff: cutoffCell.address, settings: settingsRange });
  }
  row = optionsStart;
  const opt = (key: string, label: string, value: number | string, format: CellFormat = 'text'): SettingRow => ({ key, label, value, format, address: at() });
  const settings: SettingRow[] = [
    { ...cutoffCell, format: 'plain' },
    { ...bwCell, format: 'number' },
    { ...testCell, format: 'number' },
    opt('eligible', 'Eligible side of the cutoff (detected from the take-up jump)', r.eligible),
    opt('rule', 'Bandwidth rule', r.bandwidth.rule),
    opt('kernel', 'Kernel', r.bandwidth.kernel),
    opt('variance', 'Variance of the estimates', r.bandwidth.variance),
    opt('draws', 'Draws of the outcome–treatment test', v.draws, 'integer'),
    opt('seed', 'Seed of the random draws', v.seed, 'integer'),
    opt('grid', 'Grid of outcome values in the test', v.grid, 'integer'),
    opt('trim', 'Trimming of the test', v.trim, 'number'),
    opt('multiplier', 'Multipliers of the test', v.multiplier),
    opt('trend_guard', 'The test also run with each side’s trend removed (the larger p-value counts)', ctx.options.trendGuard === false ? 'off' : 'on'),
    opt('sensitivity', 'Multiples of the test bandwidth shown', sensitivity.length ? sensitivity.join(', ') : 'off'),
  ];
  const refs: F.SettingRefs = { cutoff: cutoffCell.address, bandwidth: bwCell.address, settings: settingsRange };

  // Result tables start below the settings and a blank row.
  let next = optionsEnd + 3;
  const tables: SummaryTable[] = [];
  const plotTables: SummaryTable[] = [];
  /** Places a table at the next free row of the sheet and adds it to `list`. */
  const placeIn = (list: SummaryTable[]) => (t: Omit<SummaryTable, 'row'>): SummaryTable => {
    const placed = { ...t, row: next + 1 };
    next += t.rows.length + (t.note ? 5 : 4);
    list.push(placed);
    return placed;
  };
  const place = placeIn(tables);
  const estimateRow = (label: string, e: EstimateSummary, formula: string): SummaryCell[] => [
    text(label),
    cell(e.estimate, 'number', formula),
    cell(e.se, 'number', F.detailField(formula, 'se')),
    cell(e.ci[0], 'number', F.detailField(formula, 'ci_low')),
    cell(e.ci[1], 'number', F.detailField(formula, 'ci_high')),
    cell(e.ci_robust[0], 'number', F.detailField(formula, 'ci_robust_low')),
    cell(e.ci_robust[1], 'number', F.detailField(formula, 'ci_robust_high')),
    cell(e.pvalue, 'pvalue', F.detailField(formula, 'pvalue')),
  ];
  const od = (o: OutcomeResult) => ({ score, treated, outcome: col(o.name) });
  // An outcome's own take-up (its rows may drop missing outcomes): only the estimate has a formula.
  const ownTakeupRow = (label: string, e: EstimateSummary, formula: string): SummaryCell[] =>
    estimateRow(label, e, formula).map((c, i) => (i <= 1 ? c : { value: c.value, format: c.format }));
  place({
    id: 'estimates',
    title: 'Take-up and effects at the cutoff',
    columns: ['', 'estimate', 'std. err.', '95% low', '95% high', 'robust 95% low', 'robust 95% high', 'p (robust)'],
    rows: [
      estimateRow('Take-up jump (first stage)', r.takeup, F.takeup({ score, treated }, refs)),
      ...r.outcomes.flatMap((o) => [
        ownTakeupRow(`${o.name}: take-up jump on its rows`, o.takeup, F.detailField(F.effect(od(o), refs), 'takeup')),
        estimateRow(`${o.name}: jump at the cutoff`, o.jump, F.jump({ score, values: col(o.name) }, refs)),
        estimateRow(`${o.name}: effect for compliers`, o.effect, F.effect(od(o), refs)),
      ]),
    ],
    note: `Jumps are the eligible side (${r.eligible} the cutoff) minus the other side; p-values are two-sided, robust bias-corrected. The first stage uses the ${r.takeup_rows.used} rows with a score and treatment; each outcome's effect for compliers is its jump divided by the take-up jump on its own rows.`,
  });
  const dash = text('–');
  place({
    id: 'validity',
    title: 'Do the data contradict the design? Outcome–treatment test',
    columns: ['outcome', 'p-value', 'Holm-adjusted p', 'verdict at 5%', 'p observed', 'p trend removed', 'statistic', '5% critical value', 'intervals', 'draws', 'bandwidth'],
    rows: r.outcomes.map((o) => {
      const v = o.validity;
      if (!v.applicable) return [text(o.name), text('not applicable'), dash, text(`no test run: ${v.reason}`), dash, dash, dash, dash, dash, dash, cell(v.bandwidth)];
      const f = F.validity(od(o), refs, testCell.address);
      const ob = v.observed;
      return [
        text(o.name),
        cell(v.pvalue, 'pvalue', f),
        v.pvalue_holm === undefined ? dash : cell(v.pvalue_holm, 'pvalue'),
        text(v.rejects ? 'contradicted' : 'not contradicted'),
        cell(ob.pvalue, 'pvalue', F.detailField(f, 'pvalue_observed')),
        v.trend_adjusted ? cell(v.trend_adjusted.pvalue, 'pvalue', F.detailField(f, 'pvalue_trend_adjusted')) : dash,
        cell(ob.statistic, 'number', F.detailField(f, 'statistic')),
        cell(ob.critical_value, 'number', F.detailField(f, 'critical_value')),
        cell(ob.intervals, 'integer'),
        cell(ob.draws, 'integer'),
        cell(ob.bandwidth, 'number'),
      ];
    }),
    note:
      'The p-value is the larger of the test on the observed outcomes (the published test) and the same test with each side’s trend in the score removed, when that applies; Holm adjusts it across the outcomes. At or below 0.05 the data contradict the design. Statistic and critical value: the observed version.',
  });
  place({
    id: 'sensitivity',
    title: 'The outcome–treatment test across bandwidths',
    columns: ['outcome', 'multiple of the test bandwidth', 'bandwidth', 'p-value', 'p observed', 'p trend removed', 'verdict at 5%'],
    rows: r.outcomes.flatMap((o) =>
      (o.validity.by_bandwidth ?? []).map((b) => {
        const head = [text(o.name), cell(b.multiple, 'plain'), cell(b.bandwidth, 'number')];
        if (b.error !== undefined) return [...head, text(`cannot run: ${b.error}`), dash, dash, text('')];
        if (b.applicable === false || b.pvalue === undefined) return [...head, text('not applicable'), dash, dash, text(b.reason ?? 'the design is sharp in this window')];
        const f = F.validity(od(o), refs, b.multiple === 1 ? testCell.address : `${testCell.address}*${b.multiple}`);
        return [
          ...head,
          cell(b.pvalue, 'pvalue', f),
          b.pvalue_observed === undefined ? dash : cell(b.pvalue_observed, 'pvalue'),
          b.pvalue_trend_adjusted === undefined ? dash : cell(b.pvalue_trend_adjusted, 'pvalue'),
          text(b.rejects ? 'contradicted' : 'not contradicted'),
        ];
      }),
    ),
  });
  if (r.density) {
    const d = r.density;
    const rows: SummaryCell[][] = [];
    const f = F.densityTest({ score }, refs);
    if (d.local_polynomial) {
      const l = d.local_polynomial;
      rows.push([text('local polynomial (Cattaneo, Jansson & Ma 2020)'), cell(l.density_below), cell(l.density_above), cell(l.log_ratio), cell(l.se),
        cell(l.pvalue, 'pvalue', d.method === 'local_polynomial' ? f : undefined), cell(l.bandwidth), text(d.method === 'local_polynomial' ? 'headline' : '')]);
    }
    if (d.mccrary) {
      const m = d.mccrary;
      rows.push([text('McCrary (2008)'), cell(m.density_below), cell(m.density_above), cell(m.log_ratio), cell(m.se),
        cell(m.pvalue, 'pvalue', d.method === 'mccrary' ? f : undefined), cell(m.bandwidth), text(d.method === 'mccrary' ? 'headline' : '')]);
    }
    place({
      id: 'density',
      title: 'Did units sort themselves across the cutoff? Density of the score',
      columns: ['test', 'density below', 'density above', 'log ratio', 'std. err.', 'p-value', 'bandwidth', ''],
      rows,
      note: d.method === 'none' ? `No density test is reliable here: ${d.unreliable ?? 'see the warnings'}. ${d.caution}` : d.caution,
    });
  }
  if (r.balance && r.balance.length > 0) {
    const opt1 = (x: number | undefined, fmt: CellFormat, formula?: string): SummaryCell => (x === undefined ? text('–') : cell(x, fmt, formula));
    place({
      id: 'balance',
      title: 'Do pre-treatment characteristics jump at the cutoff?',
      columns: ['covariate', 'jump', 'p (robust)', 'Holm p', 'permutation p', 'permutation Holm p', 'units per side (q)'],
      rows: r.balance.map((b) => [
        text(b.name),
        opt1(b.jump, 'number'),
        opt1(b.pvalue, 'pvalue', F.balance({ score, covariate: col(b.name) }, refs)),
        opt1(b.pvalue_holm, 'pvalue'),
        opt1(b.permutation_pvalue, 'pvalue'),
        opt1(b.permutation_pvalue_holm, 'pvalue'),
        opt1(b.q, 'integer'),
      ]),
      note: 'Holm adjusts across the covariates. Permutation p: Canay & Kamat (2018), the q units nearest the cutoff on each side.',
    });
  }
  const withCompliers = r.outcomes.filter((o) => o.compliers);
  if (withCompliers.length > 0) {
    place({
      id: 'compliers',
      title: 'Mean outcomes of compliers',
      columns: ['outcome', 'treated compliers', 'untreated compliers'],
      rows: withCompliers.map((o) => [
        text(o.name),
        cell(o.compliers!.mean_treated, 'number'),
        cell(o.compliers!.mean_untreated, 'number'),
      ]),
      // No worksheet function gives these means (EFFECT's detail table has none): values, not formulas.
      note: 'Means implied by the complier distributions at the cutoff; computed by the check (no worksheet function gives them).',
    });
  }

  const verdicts = verdictSentences(r);
  const warnings = [
    ...r.warnings,
    ...r.outcomes.flatMap((o) => o.warnings.map((w) => `${o.name}: ${w}`)),
    ...(r.density?.warnings ?? []).map((w) => `density: ${w}`),
    ...(r.balance ?? []).flatMap((b) => b.warnings.map((w) => `${b.name}: ${w}`)),
  ];
  const textBlocks: TextBlock[] = [];
  for (const [id, title, lines] of [
    ['verdicts', 'What the check found', verdicts.map((v) => v.text)],
    ['warnings', 'Warnings', warnings],
    ['cautions', 'Cautions', CAUTIONS],
  ] as const) {
    if (lines.length === 0) continue;
    textBlocks.push({ id, title, lines: [...lines], row: next + 1 });
    next += lines.length + 2;
  }

  // Pictures of the charts, two a row of CHART_ROWS sheet rows each.
  const charts = buildCharts(r, ctx.names.treated);
  next += 1;
  charts.forEach((c, i) => {
    c.anchor = { row: next + 1 + Math.floor(i / 2) * CHART_ROWS, col: (i % 2) * CHART_COLS };
  });
  next += Math.ceil(charts.length / 2) * CHART_ROWS + 1;

  // Tables behind the plots.
  const placePlot = placeIn(plotTables);
  for (const b of r.bins ?? []) {
    const values = b.name === ctx.names.treated ? treated : col(b.name);
    const f = F.bins({ score, values }, refs);
    placePlot({
      id: `bins:${b.name}`,
      title: `Binned means of ${b.name === ctx.names.treated ? `take-up (${b.name})` : b.name} by score`,
      columns: ['side', 'from', 'to', 'midpoint', 'mean', 'count'],
      rows: b.bins.map((x, i) => [
        { value: x.side, format: 'text', ...(i === 0 ? { formula: f, spills: true } : {}) },
        cell(x.from),
        cell(x.to),
        cell(x.midpoint),
        cell(x.mean),
        cell(x.count, 'integer'),
      ]),
      note: `${b.bins_below} bins below and ${b.bins_above} above (evenly spaced per side); empty bins are left out. Fit lines: intercept ${num(b.fit.below.intercept)} and slope ${num(b.fit.below.slope)} below, ${num(b.fit.above.intercept)} and ${num(b.fit.above.slope)} above, over the bandwidth.`,
    });
  }
  for (const o of withCompliers) {
    const c = o.compliers!;
    const t = placePlot({
      id: `compliers:${o.name}`,
      title: `Implied distributions of compliers' ${o.name}`,
      columns: [o.name, 'treated compliers (CDF)', 'untreated compliers (CDF)'],
      rows: [],
    });
    const atRange = `${F.cellAddress(t.row + 1, 0)}:${F.cellAddress(t.row + c.at.length, 0)}`;
    t.rows = c.at.map((x, i) => [
      cell(x),
      { value: c.cdf_treated[i], format: 'number', ...(i === 0 ? { formula: F.complierCdf(od(o), refs, atRange, 1), spills: true } : {}) },
      { value: c.cdf_untreated[i], format: 'number', ...(i === 0 ? { formula: F.complierCdf(od(o), refs, atRange, 0), spills: true } : {}) },
    ]);
    next += c.at.length;
    const falls = [...c.decreasing_treated.map((s) => `treated ${num(s.from)} to ${num(s.to)}`), ...c.decreasing_untreated.map((s) => `untreated ${num(s.from)} to ${num(s.to)}`)];
    t.note = falls.length ? `Falling stretches (a probability cannot fall): ${falls.join('; ')}.` : 'Neither implied distribution falls anywhere.';
    next += 1;
  }

  return {
    title: 'Cutline summary of a fuzzy regression-discontinuity check',
    source: ctx.source,
    dataLine: [
      `score ${ctx.names.score}`,
      `treated ${ctx.names.treated}`,
      `outcome${r.outcomes.length > 1 ? 's' : ''} ${r.outcomes.map((o) => o.name).join(', ')}`,
      ...(r.balance?.length ? [`covariate${r.balance.length > 1 ? 's' : ''} ${r.balance.map((b) => b.name).join(', ')}`] : []),
      `${r.rows.read} rows read, ${r.rows.used} used${r.rows.dropped ? ` (${r.rows.dropped} with a missing value)` : ''}${r.donut ? `, ${r.donut.excluded} inside the donut of ${r.donut.radius}` : ''}`,
    ].join('; '),
    sheetName: summarySheetName(ctx.takenSheetNames),
    note:
      'The values were computed by the cutline command. The formulas beside them are text: with the Cutline add-in in Excel, typing one into a cell (with "=" in front) computes the same value live from the data and the settings cells.',
    settings,
    settingsRange,
    verdicts,
    tables,
    textBlocks,
    plotTables,
    charts,
    warnings,
    cautions: [...CAUTIONS],
    headline: headline(r),
  };
}

function verdictSentences(r: CheckResult): Verdict[] {
  const out: Verdict[] = [];
  const say = (text: string, concern = false): void => {
    out.push({ text, concern });
  };
  const side = r.eligible === 'above' ? `at or above ${r.cutoff}` : `below ${r.cutoff}`;
  say(
    `Units scoring ${side} are eligible. Take-up jumps by ${num(r.takeup.estimate)} at the cutoff (robust 95% interval ${num(r.takeup.ci_robust[0])} to ${num(r.takeup.ci_robust[1])}, ${pIs(r.takeup.pvalue)}).`,
  );
  for (const o of r.outcomes) {
    const e = o.effect;
    const v = o.validity;
    const covers = e.ci_robust[0] <= 0 && e.ci_robust[1] >= 0;
    const effect = `${o.name}: the effect for compliers is ${num(e.estimate)} (robust 95% interval ${num(e.ci_robust[0])} to ${num(e.ci_robust[1])}${covers ? ', which includes no effect' : ''}). `;
    if (!v.applicable) say(`${effect}The outcome–treatment test was not run: ${v.reason.replace(/\.$/, '')}.`);
    else
      say(
        effect +
          (v.rejects
            ? `The outcome–treatment test rejects (${pIs(v.pvalue)}): the data contradict the design for this outcome.`
            : `The outcome–treatment test does not reject (${pIs(v.pvalue)}): the data do not contradict the design for this outcome, which is not proof that it holds.`),
        v.rejects,
      );
  }
  const dp = r.density?.pvalue;
  if (r.density && dp === undefined) say(`No test of the score's density is reliable here: ${r.density.unreliable ?? 'see the warnings'}.`);
  if (dp !== undefined) {
    say(
      dp <= 0.05
        ? `The density of the score jumps at the cutoff (${pIs(dp)}): a sign that units may have sorted themselves across it.`
        : `The density of the score shows no significant jump at the cutoff (${pIs(dp)}).`,
      dp <= 0.05,
    );
  }
  for (const b of r.balance ?? []) {
    if (b.pvalue_holm === undefined) continue;
    say(
      b.pvalue_holm <= 0.05
        ? `${b.name} jumps at the cutoff (Holm-adjusted ${pIs(b.pvalue_holm)}): units on the two sides differ before treatment.`
        : `${b.name} shows no significant jump at the cutoff (Holm-adjusted ${pIs(b.pvalue_holm)}).`,
      b.pvalue_holm <= 0.05,
    );
  }
  return out;
}

function headline(r: CheckResult): Headline {
  const holm = (r.balance ?? []).map((b) => b.pvalue_holm).filter((p): p is number => p !== undefined);
  return {
    cutoff: r.cutoff,
    eligible: r.eligible,
    rows_used: r.rows.used,
    bandwidth: r.bandwidth.value,
    takeup: r.takeup.estimate,
    takeup_pvalue: r.takeup.pvalue,
    outcomes: r.outcomes.map((o) => ({
      name: o.name,
      effect: o.effect.estimate,
      ci_robust: o.effect.ci_robust,
      effect_pvalue: o.effect.pvalue,
      validity_pvalue: o.validity.applicable ? o.validity.pvalue : undefined,
      rejects: o.validity.applicable ? o.validity.rejects : undefined,
    })),
    density_pvalue: r.density?.pvalue,
    balance_min_holm: holm.length ? Math.min(...holm) : undefined,
  };
}
