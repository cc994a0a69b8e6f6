/**
 * An SVG chart (chartSvg.ts) as PNG bytes, through resvg (@resvg/resvg-js,
 * which ships its compiled renderer inside the npm package: no browser, no
 * download). Rendered at twice the chart's size so the picture stays sharp
 * when a workbook is printed or zoomed.
 *
 * @example svgPng(chartSvg(spec)) // Uint8Array starting with the PNG signature
 */
import { Resvg } from '@resvg/resvg-js';
import { CHART_WIDTH } from './chartSvg';

export function svgPng(svg: string, scale = 2): Uint8Array {
  const r = new Resvg(svg, {
    fitTo: { mode: 'width', value: CHART_WIDTH * scale },
    font: { loadSystemFonts: true, defaultFontFamily: 'DejaVu Sans' },
    background: '#ffffff',
  });
  return r.render().asPng();
}
