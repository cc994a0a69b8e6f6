/** Number formatting for the readable output (presentation only). */

/** Four significant digits, plain notation for everyday magnitudes. */
export function num(v: number, digits = 4): string {
  if (!Number.isFinite(v)) return String(v);
  if (v === 0) return '0';
  const a = Math.abs(v);
  if (a >= 1e6 || a < 1e-4) return v.toExponential(digits - 1);
  const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(a)));
  return v.toFixed(Math.min(decimals, 8));
}

export function pval(p: number): string {
  if (!Number.isFinite(p)) return String(p);
  if (p < 0.001) return '<0.001';
  return p.toFixed(3);
}

export function interval(ci: [number, number]): string {
  return `[${num(ci[0])}, ${num(ci[1])}]`;
}

export function padRight(s: string, w: number): string {
  return s.length >= w ? s : s + ' '.repeat(w - s.length);
}

export function padLeft(s: string, w: number): string {
  return s.length >= w ? s : ' '.repeat(w - s.length) + s;
}

/** Word-wraps a caution to the given width, indenting continuation lines. */
export function wrap(text: string, width: number, indent: string): string {
  const words = text.split(/\s+/);
  const lines: string[] = [];
  let line = '';
  for (const w of words) {
    if (line.length + w.length + 1 > width && line !== '') {
      lines.push(line);
      line = w;
    } else line = line === '' ? w : `${line} ${w}`;
  }
  if (line) lines.push(line);
  return lines.map((l, i) => (i === 0 ? l : indent + l)).join('\n');
}
