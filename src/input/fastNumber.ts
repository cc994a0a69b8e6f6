/**
 * Decimal text to a double straight from its bytes (ASCII digits; a UTF-8
 * text's other characters never look like them), for the plain CSV path. Exact by Clinger's fast path (Clinger 1990, "How to read floating
 * point numbers accurately", PLDI): with at most 15 significant digits the
 * mantissa m is an exact double, and so is 10^k for k ≤ 22, so m·10^k or
 * m/10^k is one correctly rounded operation — the same double as Number().
 * Anything else (more digits, larger exponents, words, markers) returns
 * SLOW and the caller uses the general cell rules of cells.ts.
 */
export const SLOW = Symbol('slow');
export const MISSING = Symbol('missing');

const POW10 = Array.from({ length: 23 }, (_, k) => Number(`1e${k}`));

/** fastNumber's answer, or the reason it has none. */
export function fastNumber(text: Uint8Array, start: number, end: number): number | typeof SLOW | typeof MISSING {
  const v = decimalOrNaN(text, start, end);
  if (v === v) return v;
  return isBlank(text, start, end) ? MISSING : SLOW;
}

/** True when the field holds only blanks (or nothing). */
export function isBlank(text: Uint8Array, start: number, end: number): boolean {
  for (let i = start; i < end; i++) if (!(text[i] === 32 || text[i] === 9 || text[i] === 13)) return false;
  return true;
}

/**
 * The double of a plain decimal field, or NaN when the field is anything
 * else (blank, a marker, a word, too many digits): one return type, so the
 * hot loop never boxes its numbers.
 */
export function decimalOrNaN(text: Uint8Array, start: number, end: number): number {
  while (start < end && (text[start] === 32 || text[start] === 9)) start++;
  while (end > start && (text[end - 1] === 32 || text[end - 1] === 9 || text[end - 1] === 13)) end--;
  if (start === end) return NaN;
  let i = start;
  let neg = false;
  let c = text[i];
  if (c === 45 || c === 43) {
    neg = c === 45;
    i++;
  }
  let m = 0;
  let digits = 0;
  let significant = 0;
  let scale = 0;
  let dot = false;
  for (; i < end; i++) {
    c = text[i];
    if (c >= 48 && c <= 57) {
      digits++;
      if (m === 0 && c === 48) {
        if (dot) scale--;
        continue;
      }
      if (++significant > 15) return NaN;
      m = m * 10 + (c - 48);
      if (dot) scale--;
    } else if (c === 46 && !dot) {
      dot = true;
    } else break;
  }
  if (digits === 0) return NaN;
  if (i < end) {
    if ((c | 32) !== 101) return NaN;
    i++;
    let eneg = false;
    c = text[i];
    if (c === 45 || c === 43) {
      eneg = c === 45;
      i++;
    }
    let e = 0;
    let edigits = 0;
    for (; i < end; i++) {
      c = text[i];
      if (c < 48 || c > 57) return NaN;
      e = e * 10 + (c - 48);
      if (++edigits > 4) return NaN;
    }
    if (edigits === 0) return NaN;
    scale += eneg ? -e : e;
  }
  if (m === 0) return neg ? -0 : 0;
  let v: number;
  if (scale >= 0) {
    if (scale > 22) return NaN;
    v = m * POW10[scale];
  } else {
    if (scale < -22) return NaN;
    v = m / POW10[-scale];
  }
  return neg ? -v : v;
}
