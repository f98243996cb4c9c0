import { describe, expect, it } from 'vitest';
import { escapeHtml, serializeJsonForScript } from './escape-html.js';

describe('escapeHtml', () => {
  it('turns markup into text', () => {
    expect(escapeHtml('<script>alert(1)</script>')).toBe('&lt;script&gt;alert(1)&lt;/script&gt;');
    expect(escapeHtml('"><img src=x onerror=alert(1)>')).toBe('&quot;&gt;&lt;img src=x onerror=alert(1)&gt;');
    expect(escapeHtml("it's & more")).toBe('it&#39;s &amp; more');
  });

  it('leaves plain text and other characters alone', () => {
    expect(escapeHtml('neck + ~mid // bridge — 3.2 kΩ')).toBe('neck + ~mid // bridge — 3.2 kΩ');
  });
});

describe('serializeJsonForScript', () => {
  const hostile = { name: '</script><script>alert(1)</script><!--', note: 'a\u2028b & c > d' };

  it('never contains a tag opener, so a string cannot close the script element', () => {
    const text = serializeJsonForScript(hostile);
    expect(text).not.toMatch(/[<>&\u2028\u2029]/u);
  });

  it('still parses back to the same value (RFC 8259 \\u escapes)', () => {
    expect(JSON.parse(serializeJsonForScript(hostile))).toEqual(hostile);
  });
});
