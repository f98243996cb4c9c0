import { describe, expect, it } from 'vitest';
import { escapeMarkdown } from './index.js';

describe('escapeMarkdown', () => {
  it('turns HTML into text', () => {
    expect(escapeMarkdown('<script>alert("x")</script> & co')).toBe('&lt;script&gt;alert\\(&quot;x&quot;\\)&lt;/script&gt; &amp; co');
  });

  it('escapes inline Markdown so ids with underscores are not italic', () => {
    expect(escapeMarkdown('neck_slug + ~bridge_screw')).toBe('neck\\_slug \\+ \\~bridge\\_screw');
    expect(escapeMarkdown('[link](http://x) **bold** `code` | cell')).toBe('\\[link\\]\\(http://x\\) \\*\\*bold\\*\\* \\`code\\` \\| cell');
  });

  it('keeps a name on one line, so it cannot start a heading', () => {
    expect(escapeMarkdown('name\n# heading\r\n- item')).toBe('name \\# heading - item');
  });
});
