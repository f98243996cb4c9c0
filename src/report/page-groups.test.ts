import { describe, expect, it } from 'vitest';
import { makeExampleReport } from '../../test/support/example-report.js';
import { renderGroupsSection } from './page-groups.js';

describe('renderGroupsSection', () => {
  const base = makeExampleReport(['neck', 'bridge']);

  it('says nothing without groups, and lists only groups of two or more, escaped', () => {
    expect(renderGroupsSection(base)).toBe('');
    const report = {
      ...base,
      groups: {
        summary: '6 wirings, 5 audibly distinct groups at these thresholds',
        thresholds: { levelDb: 1, spectrumDb: 1, brightnessPercent: 3 },
        groups: [
          { group: 1, members: ['w1'], expressions: ['neck'] },
          { group: 2, members: ['w2', 'w5'], expressions: ['bridge', '<b>neck // bridge</b>'] },
        ],
      },
    };
    const html = renderGroupsSection(report);
    expect(html).toContain('<strong>6 wirings, 5 audibly distinct groups at these thresholds</strong>');
    expect(html).toContain('<li>group 2: w2 bridge, w5 &lt;b&gt;neck // bridge&lt;/b&gt;</li>');
    expect(html).not.toContain('group 1:');
  });

  it('says so when every wiring stands alone', () => {
    const html = renderGroupsSection({
      ...base,
      groups: { summary: '6 wirings, 6 audibly distinct groups at these thresholds', thresholds: { levelDb: 1, spectrumDb: 1, brightnessPercent: 3 }, groups: [] },
    });
    expect(html).toContain('No two wirings sound alike at these thresholds');
  });
});
