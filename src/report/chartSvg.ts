/**
 * One chart specification (summaryTypes.ts) as a standalone SVG string:
 * scales and tick values from d3-scale, paths from d3-shape, drawn without a
 * DOM so the same text goes into the HTML page and, rendered to PNG, into the
 * workbook. Every chart has a title, axis labels and a text alternative
 * (<title> and <desc>, referenced by aria-labelledby); the colours differ in
 * dash pattern and marker too, so the chart reads in black and white.
 *
 * Elements a test can count: `circle.bin-mean` (one per non-empty bin),
 * `rect.bar` (one per histogram bin), `path.series` (one per line),
 * `rect.stretch` (one per marked stretch).
 *
 * @example chartSvg(model.charts[0]) // '<svg xmlns="http://www.w3.org/2000/svg" …'
 */
import { scaleLinear } from 'd3-scale';
import { curveLinear, curveStepAfter, line } from 'd3-shape';
import { escapeMarkup as esc } from './escapeMarkup';
import { ChartSpec } from './summaryTypes';

export const CHART_WIDTH = 640;
export const CHART_HEIGHT = 400;
const M = { top: 62, right: 24, bottom: 56, left: 72 };
const COLORS = ['#1f4e9c', '#b3401a', '#2f7d32', '#7b3fa0', '#8a6d00'];
const FONT = "DejaVu Sans, Arial, Helvetica, sans-serif";

const r2 = (v: number): string => (Math.round(v * 100) / 100).toString();

function extent(values: number[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (!Number.isFinite(v)) continue;
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  if (lo === Infinity) return [0, 1];
  if (lo === hi) return [lo - 1, hi + 1];
  return [lo, hi];
}

export function chartSvg(spec: ChartSpec, idPrefix = ''): string {
  const W = CHART_WIDTH;
  const H = CHART_HEIGHT;
  const xs: number[] = [];
  const ys: number[] = [];
  for (const p of spec.points ?? []) (xs.push(p.x), ys.push(p.y));
  for (const l of spec.lines ?? []) for (const p of l.points) (xs.push(p.x), ys.push(p.y));
  for (const b of spec.bars ?? []) (xs.push(b.x0, b.x1), ys.push(0, b.y));
  for (const v of spec.verticals ?? []) xs.push(v.x);
  for (const h of spec.horizontals ?? []) ys.push(h.y);
  const x = scaleLinear().domain(extent(xs)).nice().range([M.left, W - M.right]);
  const y = scaleLinear()
    .domain(spec.yDomain ?? extent(ys))
    .nice()
    .range([H - M.bottom, M.top]);
  const [y0, y1] = y.range();
  const id = `${idPrefix}${spec.id.replace(/[^A-Za-z0-9_-]/g, '_')}`;
  const out: string[] = [];
  out.push(
    `<svg xmlns="http://www.w3.org/2000/svg" class="chart" data-chart="${esc(spec.id)}" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}" role="img" aria-labelledby="${id}-t ${id}-d" font-family="${FONT}" font-size="14">`,
  );
  out.push(`<title id="${id}-t">${esc(spec.title)}</title><desc id="${id}-d">${esc(spec.alt)}</desc>`);
  out.push(`<rect x="0" y="0" width="${W}" height="${H}" fill="#ffffff"/>`);
  out.push(`<text x="${M.left}" y="24" font-size="17" font-weight="bold" fill="#111">${esc(spec.title)}</text>`);
  // Grid and axes.
  const xt = x.ticks(8);
  const yt = y.ticks(6);
  const fx = x.tickFormat(8);
  const fy = y.tickFormat(6);
  out.push('<g class="grid" stroke="#e3e3e3" stroke-width="1">');
  for (const t of yt) out.push(`<line x1="${M.left}" x2="${W - M.right}" y1="${r2(y(t))}" y2="${r2(y(t))}"/>`);
  out.push('</g>');
  for (const s of spec.stretches ?? []) {
    const a = x(Math.min(s.x0, s.x1));
    const b = x(Math.max(s.x0, s.x1));
    out.push(`<rect class="stretch" x="${r2(a)}" y="${r2(y1)}" width="${r2(Math.max(b - a, 2))}" height="${r2(y0 - y1)}" fill="#f4c542" fill-opacity="0.35"><title>${esc(s.label)}</title></rect>`);
  }
  for (const b of spec.bars ?? []) {
    const a = x(b.x0);
    const w = Math.max(x(b.x1) - a - 1, 0.5);
    out.push(`<rect class="bar" x="${r2(a)}" y="${r2(y(b.y))}" width="${r2(w)}" height="${r2(y0 - y(b.y))}" fill="#8fa9d6" stroke="#1f4e9c" stroke-width="0.5" data-count="${b.count}"/>`);
  }
  out.push(`<g class="axis" stroke="#333" stroke-width="1">`);
  out.push(`<line x1="${M.left}" x2="${W - M.right}" y1="${y0}" y2="${y0}"/><line x1="${M.left}" x2="${M.left}" y1="${y0}" y2="${y1}"/>`);
  for (const t of xt) out.push(`<line x1="${r2(x(t))}" x2="${r2(x(t))}" y1="${y0}" y2="${y0 + 5}"/>`);
  for (const t of yt) out.push(`<line x1="${M.left - 5}" x2="${M.left}" y1="${r2(y(t))}" y2="${r2(y(t))}"/>`);
  out.push('</g><g class="ticks" fill="#333">');
  for (const t of xt) out.push(`<text x="${r2(x(t))}" y="${y0 + 19}" text-anchor="middle">${esc(fx(t))}</text>`);
  for (const t of yt) out.push(`<text x="${M.left - 8}" y="${r2(y(t) + 4)}" text-anchor="end">${esc(fy(t))}</text>`);
  out.push('</g>');
  out.push(`<text class="x-label" x="${(M.left + W - M.right) / 2}" y="${H - 12}" text-anchor="middle" fill="#111">${esc(spec.xLabel)}</text>`);
  out.push(`<text class="y-label" transform="translate(18 ${(y0 + y1) / 2}) rotate(-90)" text-anchor="middle" fill="#111">${esc(spec.yLabel)}</text>`);
  for (const h of spec.horizontals ?? []) {
    out.push(`<line class="reference" x1="${M.left}" x2="${W - M.right}" y1="${r2(y(h.y))}" y2="${r2(y(h.y))}" stroke="#b3401a" stroke-dasharray="6 4"/>`);
    out.push(`<text x="${W - M.right - 4}" y="${r2(y(h.y) - 5)}" text-anchor="end" fill="#b3401a" font-size="12">${esc(h.label)}</text>`);
  }
  for (const v of spec.verticals ?? []) {
    out.push(`<line class="vertical" x1="${r2(x(v.x))}" x2="${r2(x(v.x))}" y1="${y0}" y2="${y1}" stroke="#555" stroke-dasharray="3 3"/>`);
    out.push(`<text x="${r2(x(v.x) + 4)}" y="${y1 + 12}" fill="#555" font-size="12">${esc(v.label)}</text>`);
  }
  (spec.lines ?? []).forEach((l, i) => {
    const path = line<{ x: number; y: number }>()
      .x((p) => x(p.x))
      .y((p) => y(p.y))
      .curve(l.step ? curveStepAfter : curveLinear)(l.points);
    const color = spec.points ? '#b3401a' : COLORS[i % COLORS.length];
    out.push(
      `<path class="series" data-label="${esc(l.label)}" d="${path}" fill="none" stroke="${color}" stroke-width="2.5"${l.dashed ? ' stroke-dasharray="8 4"' : ''}/>`,
    );
    if (!spec.points && !l.step) for (const p of l.points) out.push(`<circle class="line-point" cx="${r2(x(p.x))}" cy="${r2(y(p.y))}" r="3.5" fill="${color}"/>`);
  });
  for (const p of spec.points ?? []) {
    out.push(`<circle class="bin-mean" cx="${r2(x(p.x))}" cy="${r2(y(p.y))}" r="3.5" fill="#1f4e9c" fill-opacity="0.85" data-count="${p.count}"/>`);
  }
  // Legend in the top margin, under the title: bin means and fit, or one entry per line.
  const entries: string[] = [];
  if (spec.points) {
    entries.push('<circle cx="6" cy="0" r="3.5" fill="#1f4e9c"/><text x="16" y="4">mean in a bin</text>');
    if (spec.lines?.length) entries.push('<line x1="0" x2="26" y1="0" y2="0" stroke="#b3401a" stroke-width="2.5"/><text x="32" y="4">local linear fit</text>');
  } else if ((spec.lines ?? []).length > 1) {
    spec.lines!.forEach((l, i) => {
      const color = COLORS[i % COLORS.length];
      entries.push(`<line x1="0" x2="26" y1="0" y2="0" stroke="${color}" stroke-width="2.5"${l.dashed ? ' stroke-dasharray="8 4"' : ''}/><text x="32" y="4">${esc(l.label)}</text>`);
    });
  }
  if (spec.stretches?.length) entries.push('<rect x="0" y="-6" width="20" height="12" fill="#f4c542" fill-opacity="0.5"/><text x="26" y="4">distribution falls</text>');
  if (entries.length) {
    out.push('<g class="legend" font-size="13" fill="#111">');
    entries.forEach((e, i) => out.push(`<g transform="translate(${M.left + i * 170} 44)">${e}</g>`));
    out.push('</g>');
  }
  out.push('</svg>');
  return out.join('');
}
