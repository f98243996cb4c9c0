import { describe, expect, it } from 'vitest';
import { parseGuitar } from '../guitar/index.js';
import { parseSwitchTexts, renderSwitchDrawing, solveSwitchPlan } from './index.js';

describe('renderSwitchDrawing', () => {
  it('escapes text, draws every lug of every pole, and keys every net', () => {
    const guitar = parseGuitar({
      name: 'Tom & Jerry\'s <test> "guitar" (invented values)',
      coils: [
        { id: 'neck', position: '160mm', resistance: '6k', inductance: '2.4H' },
        { id: 'bridge', position: '40mm', resistance: '7k', inductance: '2.8H' },
      ],
    });
    const kit = parseSwitchTexts(['toggle-2-position-2-pole']);
    const result = solveSwitchPlan(kit, 2, [
      { kind: 'wiring', network: { kind: 'element', element: 0, inverted: false }, expression: 'neck' },
      { kind: 'wiring', network: { kind: 'series', parts: [{ kind: 'element', element: 0, inverted: false }, { kind: 'element', element: 1, inverted: false }] }, expression: 'neck + bridge' },
    ]);
    expect(result.plan).not.toBeNull();
    const svg = renderSwitchDrawing(guitar, result.plan as NonNullable<typeof result.plan>);
    expect(svg).toContain('Tom &amp; Jerry&#39;s &lt;test&gt; &quot;guitar&quot;');
    expect(svg).not.toContain('<test>');
    // Two poles of a common and two contact lugs each: six lug circles.
    expect(svg.match(/<circle /gu)).toHaveLength(6);
    expect(svg).toMatch(/<tspan font-weight="bold">hot<\/tspan>/u);
    expect(svg).toMatch(/<tspan font-weight="bold">ground<\/tspan>/u);
  });
});
