/**
 * escapeMarkup against the predefined entities of XML 1.0 (W3C, 5th ed., section 4.6:
 * &amp; &lt; &gt; &quot;), which the HTML page and the SVG charts rely on.
 */
import { escapeMarkup } from '../../src/report/escapeMarkup';

describe('escapeMarkup', () => {
  it('replaces the four characters with their predefined entities', () => {
    expect(escapeMarkup('p < 0.05 & "robust" > 0')).toBe('p &lt; 0.05 &amp; &quot;robust&quot; &gt; 0');
  });

  it('escapes an ampersand once, not the entities it makes', () => {
    expect(escapeMarkup('&lt;')).toBe('&amp;lt;');
  });

  it('leaves other text as it is', () => {
    expect(escapeMarkup("kWh saved – the cutoff's side")).toBe("kWh saved – the cutoff's side");
  });
});
