/**
 * The summary model as one self-contained HTML page: inline CSS and SVG, no
 * script, no network. Settings, the verdicts in plain words, every result
 * table, the plots (chartSvg.ts) with their text alternatives, warnings and
 * cautions; the tables behind the plots are folded under each plot. Laid out
 * to print on A4/Letter (charts never split across pages).
 *
 * @example fs.writeFileSync('report.html', htmlReport(buildSummary(result, ctx)))
 */
import { chartSvg } from './chartSvg';
import { escapeMarkup as esc } from './escapeMarkup';
import { num, pval } from './numberText';
import { SummaryCell, SummaryModel, SummaryTable } from './summaryTypes';

export function cellText(c: SummaryCell): string {
  if (c.value === null) return '';
  if (typeof c.value === 'string') return c.value;
  if (c.format === 'pvalue') return pval(c.value);
  if (c.format === 'integer' || c.format === 'plain') return String(c.value);
  return num(c.value);
}

function tableHtml(t: SummaryTable, extraClass = ''): string {
  const head = t.columns.map((c) => `<th scope="col">${esc(c)}</th>`).join('');
  const body = t.rows
    .map(
      (r) =>
        '<tr>' +
        r
          .map((c, i) => {
            // A dash stands for a number that does not exist: aligned with the numbers.
            const numeric = typeof c.value === 'number' || c.value === '–';
            const cls = numeric ? ' class="num"' : '';
            const tip = c.formula ? ` title="${esc('=' + c.formula)}"` : '';
            return i === 0 ? `<th scope="row"${cls}${tip}>${esc(cellText(c))}</th>` : `<td${cls}${tip}>${esc(cellText(c))}</td>`;
          })
          .join('') +
        '</tr>',
    )
    .join('\n');
  return `<table class="results ${extraClass}" data-table="${esc(t.id)}"><caption>${esc(t.title)}</caption><thead><tr>${head}</tr></thead><tbody>\n${body}\n</tbody></table>${
    t.note ? `<p class="note">${esc(t.note)}</p>` : ''
  }`;
}

const CSS = `
:root { color-scheme: light; }
body { font-family: "DejaVu Sans", "Segoe UI", Arial, Helvetica, sans-serif; color: #111; background: #fff; margin: 0; line-height: 1.45; }
main { max-width: 1120px; margin: 0 auto; padding: 24px 32px 48px; }
h1 { font-size: 1.6rem; margin: 0 0 4px; }
h2 { font-size: 1.2rem; margin: 32px 0 10px; border-bottom: 2px solid #1f4e9c; padding-bottom: 4px; }
.source { color: #444; margin: 0 0 16px; }
.verdicts { background: #f1f5fc; border-left: 5px solid #1f4e9c; padding: 12px 18px; margin: 16px 0; }
.verdicts li { margin: 6px 0; }
.verdict-reject { color: #9c1f1f; font-weight: bold; }
table.results { border-collapse: collapse; margin: 8px 0 4px; font-size: 0.9rem; width: 100%; }
table.results caption { text-align: left; font-weight: bold; padding: 6px 0; font-size: 1rem; }
table.results th, table.results td { border-bottom: 1px solid #d7d7d7; padding: 4px 8px; text-align: left; vertical-align: top; }
table.results thead th { border-bottom: 2px solid #555; font-weight: 600; background: #fafafa; }
table.results .num { text-align: right; font-variant-numeric: tabular-nums; white-space: nowrap; }
table.settings td:first-child { font-family: "DejaVu Sans Mono", Consolas, monospace; color: #333; }
p.note { color: #444; font-size: 0.85rem; margin: 2px 0 14px; }
figure { margin: 18px 0 24px; break-inside: avoid; page-break-inside: avoid; }
figure svg { max-width: 100%; height: auto; border: 1px solid #e0e0e0; }
figcaption { font-size: 0.85rem; color: #333; margin-top: 4px; }
details { margin-top: 4px; }
summary { cursor: pointer; color: #1f4e9c; font-size: 0.85rem; }
.plots { display: grid; grid-template-columns: repeat(auto-fill, minmax(460px, 1fr)); column-gap: 28px; }
ul.cautions li, ul.warnings li { margin: 5px 0; }
.warnings { color: #6b4500; }
footer { margin-top: 36px; color: #555; font-size: 0.8rem; }
@media print {
  main { max-width: none; padding: 0; }
  h2 { break-after: avoid; page-break-after: avoid; }
  table.results { break-inside: auto; font-size: 9pt; }
  details { display: none; }
  figure svg { max-width: 16cm; }
  a { color: inherit; text-decoration: none; }
}
@page { margin: 16mm; }
`;

export function htmlReport(m: SummaryModel): string {
  const settingsRows = m.settings
    .map(
      (s) =>
        `<tr><td>${esc(s.key)}</td><td class="${typeof s.value === 'number' ? 'num' : ''}"${s.formula ? ` title="${esc('=' + s.formula)}"` : ''}>${esc(cellText({ value: s.value, format: s.format ?? 'number' }))}</td><td>${esc(s.label)}</td></tr>`,
    )
    .join('\n');
  const plotTable = new Map(m.plotTables.map((t) => [t.id, t]));
  const resultTable = new Map(m.tables.map((t) => [t.id, t]));
  const figures = m.charts
    .map((c, i) => {
      const t = c.table ? plotTable.get(c.table) ?? resultTable.get(c.table) : undefined;
      return `<figure id="plot-${i + 1}" data-chart="${esc(c.id)}">${chartSvg(c, `c${i + 1}-`)}<figcaption><strong>Figure ${i + 1}.</strong> ${esc(c.alt)}</figcaption>${
        t ? `<details><summary>The numbers behind this plot</summary>${tableHtml(t, 'plot-data')}</details>` : ''
      }</figure>`;
    })
    .join('\n');
  const verdicts = m.verdicts.map((v) => `<li${v.concern ? ' class="verdict-reject"' : ''}>${esc(v.text)}</li>`).join('\n');
  return `<!DOCTYPE html>
<html lang="en">
<head>
<meta charset="utf-8">
<meta name="viewport" content="width=device-width, initial-scale=1">
<title>${esc(m.title)}: ${esc(m.source)}</title>
<style>${CSS}</style>
</head>
<body>
<main>
<h1>${esc(m.title)}</h1>
<p class="source">Data: <strong>${esc(m.source)}</strong> — ${esc(m.dataLine)}</p>
<section aria-labelledby="h-verdicts"><h2 id="h-verdicts">What the check found</h2>
<ul class="verdicts">
${verdicts}
</ul></section>
<section aria-labelledby="h-settings"><h2 id="h-settings">Settings of the check</h2>
<table class="results settings"><caption>The options the numbers below come from (the settings block of the workbook report)</caption><thead><tr><th scope="col">name</th><th scope="col">value</th><th scope="col">meaning</th></tr></thead><tbody>
${settingsRows}
</tbody></table>
</section>
<section aria-labelledby="h-results"><h2 id="h-results">Results</h2>
${m.tables.map((t) => tableHtml(t)).join('\n')}
</section>
<section aria-labelledby="h-plots"><h2 id="h-plots">Plots</h2>
<div class="plots">
${figures}
</div></section>
${m.warnings.length ? `<section aria-labelledby="h-warnings"><h2 id="h-warnings">Warnings</h2><ul class="warnings">${m.warnings.map((w) => `<li>${esc(w)}</li>`).join('\n')}</ul></section>` : ''}
<section aria-labelledby="h-cautions"><h2 id="h-cautions">Cautions</h2>
<ul class="cautions">
${m.cautions.map((c) => `<li>${esc(c)}</li>`).join('\n')}
</ul></section>
<footer>Written by Cutline. Hover a number to see the worksheet formula that computes it live in Excel with the Cutline add-in.</footer>
</main>
</body>
</html>
`;
}
