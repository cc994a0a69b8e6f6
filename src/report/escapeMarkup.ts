/**
 * Text made safe inside HTML or SVG markup, in element content and in
 * double-quoted attributes: `&`, `<`, `>` and `"` become the predefined
 * entities of XML 1.0 (section 4.6), which HTML reads the same way.
 *
 * @example escapeMarkup('p < 0.05 & "robust"') // 'p &lt; 0.05 &amp; &quot;robust&quot;'
 */
export function escapeMarkup(s: string): string {
  return s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');
}
