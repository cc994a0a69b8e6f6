// Charts as SVG text and as PNG: one mark per bin and per line, a title, axis labels and a text
// alternative, names escaped, and an SVG that resvg (an outside SVG parser and renderer) accepts.
import { chartSvg, CHART_HEIGHT, CHART_WIDTH } from '../../src/report/chartSvg';
import { htmlReport } from '../../src/report/htmlReport';
import { ChartSpec } from '../../src/report/summaryTypes';
import { svgPng } from '../../src/report/svgPng';

const spec: ChartSpec = {
  id: 'bins:<y>',
  title: 'Bills & <arrears> against the score',
  xLabel: 'score',
  yLabel: 'mean bill',
  alt: 'Mean bill in 5 bins, with fit lines; a "quoted" word.',
  points: [1, 2, 3, 4, 5].map((x) => ({ x, y: x * x, count: 10 + x })),
  lines: [
    { label: 'fit below', points: [{ x: 1, y: 1 }, { x: 3, y: 9 }] },
    { label: 'fit above', points: [{ x: 3, y: 10 }, { x: 5, y: 25 }] },
  ],
  verticals: [{ x: 3, label: 'cutoff 3' }],
  stretches: [{ x0: 4, x1: 4.5, label: 'falls' }],
};

describe('chartSvg', () => {
  const svg = chartSvg(spec);
  test('one circle per bin, one path per line, the stretch, title and description escaped', () => {
    expect(svg.match(/<circle class="bin-mean"/g)).toHaveLength(5);
    expect(svg.match(/<path class="series"/g)).toHaveLength(2);
    expect(svg.match(/<rect class="stretch"/g)).toHaveLength(1);
    expect(svg).toContain('<title id="bins__y_-t">Bills &amp; &lt;arrears&gt; against the score</title>');
    expect(svg).toContain('&quot;quoted&quot;');
    expect(svg).toContain('aria-labelledby="bins__y_-t bins__y_-d"');
    expect(svg).toMatch(/class="x-label"[^>]*>score</);
    expect(svg).toMatch(/class="y-label"[^>]*>mean bill</);
  });

  test('bins are placed left to right and bottom to top inside the plot area', () => {
    const cx = [...svg.matchAll(/class="bin-mean" cx="([\d.]+)" cy="([\d.]+)"/g)].map((m) => [Number(m[1]), Number(m[2])]);
    for (let i = 1; i < cx.length; i++) {
      expect(cx[i][0]).toBeGreaterThan(cx[i - 1][0]);
      expect(cx[i][1]).toBeLessThan(cx[i - 1][1]);
    }
    for (const [x, y] of cx) {
      expect(x).toBeGreaterThan(0);
      expect(x).toBeLessThan(CHART_WIDTH);
      expect(y).toBeGreaterThan(0);
      expect(y).toBeLessThan(CHART_HEIGHT);
    }
  });

  test('resvg parses and renders it to a PNG twice the size', () => {
    const png = svgPng(svg);
    expect([...png.slice(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    const view = new DataView(png.buffer, png.byteOffset);
    expect(view.getUint32(16)).toBe(CHART_WIDTH * 2);
    expect(view.getUint32(20)).toBe(CHART_HEIGHT * 2);
  });

  test('a histogram draws one bar per bin', () => {
    const h = chartSvg({ id: 'h', title: 'Scores', xLabel: 'score', yLabel: 'units', alt: 'A histogram of seven bins.', bars: [0, 1, 2, 3, 4, 5, 6].map((k) => ({ x0: k, x1: k + 1, y: k + 1, count: k + 1 })) });
    expect(h.match(/<rect class="bar"/g)).toHaveLength(7);
  });
});

describe('htmlReport', () => {
  test('escapes names and holds no script or outside reference', () => {
    const html = htmlReport({
      title: 'T',
      source: 'a<b>.csv',
      dataLine: 'score s; treated d',
      sheetName: 'S',
      note: 'n',
      settings: [{ key: 'cutoff', label: 'Cutoff', value: 0, address: '$B$6', format: 'number' }],
      settingsRange: '$A$9:$B$18',
      verdicts: [{ text: 'v <1>', concern: true }],
      tables: [{ id: 't', title: 'Tab', columns: ['a', 'b'], rows: [[{ value: 'x<y', format: 'text' }, { value: 0.0004, format: 'pvalue', formula: 'CUTLINE.TAKEUP(A, B, $B$6)' }]], row: 20 }],
      textBlocks: [],
      plotTables: [],
      charts: [spec],
      warnings: [],
      cautions: ['c'],
      headline: { cutoff: 0, eligible: 'above', rows_used: 1, bandwidth: 1, takeup: 1, takeup_pvalue: 0, outcomes: [] },
    });
    expect(html).toContain('a&lt;b&gt;.csv');
    expect(html).toContain('<li class="verdict-reject">v &lt;1&gt;</li>');
    expect(html).toContain('<th scope="row">x&lt;y</th>');
    expect(html).toContain('<td class="num" title="=CUTLINE.TAKEUP(A, B, $B$6)">&lt;0.001</td>');
    expect(html).not.toMatch(/<script|<link|src="http|href="http|@import/i);
    expect(html.match(/<svg /g)).toHaveLength(1);
  });
});
