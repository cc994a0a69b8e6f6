/**
 * The index of a batch: one row per input file, its verdicts and headline
 * numbers (or its error), as CSV (for a spreadsheet) and as an HTML page
 * linking each file's reports. Outcomes are matched by position: every file
 * is checked with the same column names.
 */
import { Headline } from '../report/summaryTypes';
import { num, pIs, pval } from '../report/numberText';
import { escapeMarkup as esc } from '../report/escapeMarkup';

export interface IndexRow {
  file: string;
  error?: string;
  headline?: Headline;
  /** Report files written, relative to the index. */
  reports: string[];
}

function csvField(v: string | number | undefined): string {
  if (v === undefined) return '';
  const s = String(v);
  return /[",\n\r]/.test(s) ? `"${s.replace(/"/g, '""')}"` : s;
}

const verdictWord = (rejects: boolean | undefined): string => (rejects === undefined ? 'not applicable' : rejects ? 'contradicted' : 'not contradicted');

export function indexCsv(rows: IndexRow[], outcomeNames: string[]): string {
  const head = ['file', 'status', 'error', 'cutoff', 'eligible', 'rows_used', 'bandwidth', 'takeup_jump', 'takeup_pvalue'];
  for (const o of outcomeNames) head.push(`${o}_effect`, `${o}_robust_low`, `${o}_robust_high`, `${o}_effect_pvalue`, `${o}_validity_pvalue`, `${o}_verdict`);
  head.push('density_pvalue', 'covariates_min_holm_pvalue', 'reports');
  const lines = [head.map(csvField).join(',')];
  for (const r of rows) {
    const h = r.headline;
    const f: Array<string | number | undefined> = [r.file, r.error ? 'error' : 'checked', r.error, h?.cutoff, h?.eligible, h?.rows_used, h?.bandwidth, h?.takeup, h?.takeup_pvalue];
    outcomeNames.forEach((_, j) => {
      const o = h?.outcomes[j];
      f.push(o?.effect, o?.ci_robust[0], o?.ci_robust[1], o?.effect_pvalue, o?.validity_pvalue, o ? verdictWord(o.rejects) : undefined);
    });
    f.push(h?.density_pvalue, h?.balance_min_holm, r.reports.join(' '));
    lines.push(f.map(csvField).join(','));
  }
  return lines.join('\n') + '\n';
}

export function indexHtml(rows: IndexRow[], outcomeNames: string[]): string {
  const failed = rows.filter((r) => r.error).length;
  const head = ['file', 'take-up jump', ...outcomeNames.flatMap((o) => [`${o}: effect [robust 95%]`, `${o}: design`]), 'density p', 'reports'];
  const body = rows
    .map((r) => {
      const h = r.headline;
      if (!h) {
        return `<tr class="failed"><th scope="row">${esc(r.file)}</th><td colspan="${head.length - 1}">error: ${esc(r.error ?? 'unknown')}</td></tr>`;
      }
      const cells = [
        `${num(h.takeup)} (${esc(pIs(h.takeup_pvalue))})`,
        ...h.outcomes.flatMap((o) => [
          `${num(o.effect)} [${num(o.ci_robust[0])}, ${num(o.ci_robust[1])}]`,
          o.validity_pvalue === undefined
            ? 'not applicable'
            : o.rejects
              ? `<span class="reject">contradicted (${esc(pIs(o.validity_pvalue))})</span>`
              : `not contradicted (${esc(pIs(o.validity_pvalue))})`,
        ]),
        h.density_pvalue === undefined ? '–' : esc(pval(h.density_pvalue)),
        r.reports.map((p) => `<a href="${esc(encodeURI(p))}">${esc(p)}</a>`).join('<br>'),
      ];
      return `<tr><th scope="row">${esc(r.file)}</th>${cells.map((c, i) => `<td${i === cells.length - 1 ? '' : ' class="num"'}>${i === cells.length - 1 || c.startsWith('<span') ? c : esc(c)}</td>`).join('')}</tr>`;
    })
    .join('\n');
  return `<!DOCTYPE html>
<html lang="en"><head><meta charset="utf-8"><title>Cutline checks: ${rows.length} files</title>
<style>
body { font-family: "DejaVu Sans", Arial, sans-serif; margin: 24px; color: #111; }
table { border-collapse: collapse; font-size: 0.9rem; }
th, td { border-bottom: 1px solid #ccc; padding: 4px 10px; text-align: left; vertical-align: top; }
thead th { border-bottom: 2px solid #444; }
td.num { font-variant-numeric: tabular-nums; }
tr.failed td { color: #9c1f1f; }
.reject { color: #9c1f1f; font-weight: bold; }
</style></head><body>
<h1>Cutline checks</h1>
<p>${rows.length} files: ${rows.length - failed} checked, ${failed} failed. "Design contradicted" means the outcome–treatment test rejects at 5%; "not contradicted" is not proof that the design holds.</p>
<table><thead><tr>${head.map((h) => `<th scope="col">${esc(h)}</th>`).join('')}</tr></thead><tbody>
${body}
</tbody></table>
</body></html>
`;
}
