/**
 * The in-page workbook's sheet drawn as HTML for the screenshot of the
 * written summary: the cells with their values as Excel would format them
 * (the plan's number formats), formulas marked, and each planned chart drawn
 * as a small SVG from the cells of its ranges (so the picture shows what the
 * live sheet computed, not the model's numbers).
 */
import { DetailedCellError } from 'hyperformula';
import { formulaRefs } from '../../src/report/formulaRefs';
import { PlanChart } from '../../src/report/workbookPort';
import { InPageWorkbook } from './inPageWorkbook';

const esc = (s: string): string => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

function show(v: unknown, format?: string): string {
  if (v instanceof DetailedCellError) return `<span class="err">${esc(String(v.value))}</span>`;
  if (typeof v === 'number') {
    if (format === 'integer') return String(Math.round(v));
    if (format === 'pvalue') return v.toFixed(3);
    if (format === 'plain') return String(v);
    return Math.abs(v) >= 1000 ? v.toFixed(1) : Number(v.toPrecision(5)).toString();
  }
  if (v === null || v === undefined) return '';
  return esc(String(v));
}

function numbers(wb: InPageWorkbook, sheet: string, range: string): number[] {
  const b = formulaRefs(range, sheet)[0];
  const id = wb.hf.getSheetId(sheet)!;
  return (wb.hf.getRangeValues({ start: { sheet: id, row: b.top - 1, col: b.left }, end: { sheet: id, row: b.bottom - 1, col: b.right } }) as unknown[][])
    .flat()
    .map((x) => (typeof x === 'number' ? x : NaN));
}

function chartSvg(wb: InPageWorkbook, sheet: string, c: PlanChart): string {
  const W = 460;
  const H = 260;
  const m = { l: 56, r: 10, t: 26, b: 40 };
  const series = c.series.map((s) => {
    const x = numbers(wb, sheet, s.x);
    const y = numbers(wb, sheet, s.y);
    return { name: s.name, pts: x.map((xi, i) => [xi, y[i]]).filter(([a, b]) => Number.isFinite(a) && Number.isFinite(b)) };
  });
  const all = series.flatMap((s) => s.pts);
  if (all.length === 0) return `<div class="chart">${esc(c.title)}: no numbers</div>`;
  const [x0, x1] = [Math.min(...all.map((p) => p[0])), Math.max(...all.map((p) => p[0]))];
  let [y0, y1] = [Math.min(...all.map((p) => p[1])), Math.max(...all.map((p) => p[1]))];
  if (c.kind === 'column') y0 = 0;
  if (y1 === y0) y1 = y0 + 1;
  const sx = (x: number): number => m.l + ((x - x0) / (x1 - x0 || 1)) * (W - m.l - m.r);
  const sy = (y: number): number => H - m.b - ((y - y0) / (y1 - y0)) * (H - m.t - m.b);
  const colours = ['#1f4e9c', '#c55a11', '#548235', '#7030a0'];
  const marks = series
    .map((s, k) => {
      const col = colours[k % colours.length];
      if (c.kind === 'column') {
        const w = Math.max(1, (W - m.l - m.r) / s.pts.length - 1);
        return s.pts.map(([x, y]) => `<rect x="${sx(x) - w / 2}" y="${sy(y)}" width="${w}" height="${H - m.b - sy(y)}" fill="${col}"/>`).join('');
      }
      if (c.kind === 'line') return `<polyline fill="none" stroke="${col}" stroke-width="2" points="${s.pts.map(([x, y]) => `${sx(x)},${sy(y)}`).join(' ')}"/>`;
      return s.pts.map(([x, y]) => `<circle cx="${sx(x)}" cy="${sy(y)}" r="2.5" fill="${col}"/>`).join('');
    })
    .join('');
  const legend = series.map((s, k) => `<tspan fill="${colours[k % colours.length]}">■ ${esc(s.name)}  </tspan>`).join('');
  return `<svg class="chart" width="${W}" height="${H}" role="img" aria-label="${esc(c.alt)}">
  <text x="${m.l}" y="16" font-weight="bold" font-size="12">${esc(c.title)}</text>
  <line x1="${m.l}" y1="${H - m.b}" x2="${W - m.r}" y2="${H - m.b}" stroke="#888"/><line x1="${m.l}" y1="${m.t}" x2="${m.l}" y2="${H - m.b}" stroke="#888"/>
  <text x="${m.l}" y="${H - m.b + 14}" font-size="10">${Number(x0.toPrecision(4))}</text><text x="${W - m.r}" y="${H - m.b + 14}" font-size="10" text-anchor="end">${Number(x1.toPrecision(4))}</text>
  <text x="${m.l - 4}" y="${H - m.b}" font-size="10" text-anchor="end">${Number(y0.toPrecision(3))}</text><text x="${m.l - 4}" y="${m.t + 8}" font-size="10" text-anchor="end">${Number(y1.toPrecision(3))}</text>
  <text x="${(W + m.l) / 2}" y="${H - 6}" font-size="11" text-anchor="middle">${esc(c.xTitle)}</text>
  <text x="12" y="${(H - m.b + m.t) / 2}" font-size="11" text-anchor="middle" transform="rotate(-90 12 ${(H - m.b + m.t) / 2})">${esc(c.yTitle)}</text>
  ${marks}<text x="${m.l + 6}" y="${m.t + 10}" font-size="10">${legend}</text></svg>`;
}

/** The sheet as an HTML page: a grid of its cells (formulas shaded) and its charts beside the rows they are anchored at. */
export function sheetHtml(wb: InPageWorkbook, sheet: string): string {
  const id = wb.hf.getSheetId(sheet)!;
  const d = wb.hf.getSheetDimensions(id);
  const fmt = wb.formats.get(sheet) ?? new Map();
  const charts = wb.charts.get(sheet) ?? [];
  const rows: string[] = [];
  const width = Math.min(d.width, 10);
  for (let r = 0; r < d.height; r++) {
    const tds: string[] = [];
    for (let c = 0; c < width; c++) {
      const addr = `${String.fromCharCode(65 + c)}${r + 1}`;
      const plan = fmt.get(addr);
      const v = wb.hf.getCellValue({ sheet: id, row: r, col: c });
      const formula = wb.hf.doesCellHaveFormula({ sheet: id, row: r, col: c }) || wb.hf.isCellPartOfArray({ sheet: id, row: r, col: c });
      // Text runs over the empty cells to its right, as on a worksheet.
      let span = 1;
      if (typeof v === 'string' && !formula) {
        while (c + span < width && wb.hf.isCellEmpty({ sheet: id, row: r, col: c + span })) span++;
      }
      const cls = [plan?.style ?? '', formula ? 'f' : '', typeof v === 'number' ? 'num' : '', span > 1 ? 'wide' : ''].join(' ');
      tds.push(`<td class="${cls}"${span > 1 ? ` colspan="${span}"` : ''}>${show(v, plan?.format)}</td>`);
      c += span - 1;
    }
    const chartHere = charts.filter((ch) => formulaRefs(ch.anchor, sheet)[0].top === r + 1);
    // Empty rows (those the charts stand on in Excel) are left out; the row numbers show where.
    if (chartHere.length === 0 && tds.every((td) => td.endsWith('></td>'))) continue;
    rows.push(`<tr><th>${r + 1}</th>${tds.join('')}</tr>${chartHere.length ? `<tr><td></td><td colspan="${width}">${chartHere.map((ch) => chartSvg(wb, sheet, ch)).join('')}</td></tr>` : ''}`);
  }
  return `<!doctype html><html><head><meta charset="utf-8"><title>${esc(sheet)}</title><style>
  body{font:12px Segoe UI,Arial,sans-serif;margin:8px} table{border-collapse:collapse} td,th{border:1px solid #e1e1e1;padding:1px 4px;white-space:nowrap;max-width:330px;overflow:hidden;text-overflow:ellipsis}
  th{background:#f3f2f1;color:#666;font-weight:normal} .num{text-align:right} .wide{max-width:none} .f{background:#eef4fb} .title{font-size:16px;font-weight:bold}
  .heading{font-weight:bold;font-size:13px} .header{font-weight:bold;border-bottom:2px solid #999} .note{font-style:italic;color:#555}
  .setting{background:#fff2cc;font-weight:bold} .verdict{font-weight:bold} .err{color:#a4262c} .chart{margin:4px 8px 4px 0;vertical-align:top}
  </style></head><body><h3>Sheet “${esc(sheet)}” (formula cells shaded blue, settings yellow)</h3><table>${rows.join('')}</table></body></html>`;
}
