import { describe, expect, it } from 'vitest';
import type { OpenString } from '../guitar/index.js';
import { resolveStringOptions } from './string-options.js';
import {
  STEEL_DENSITY_KG_PER_M3,
  STEEL_YOUNGS_MODULUS_PA,
  TYPICAL_INHARMONICITY,
  TYPICAL_STRING_SET,
  TYPICAL_STRING_SET_SCALE_M,
  stringTension,
  typicalInharmonicity,
} from './typical-string-set.js';

const bOf = (openHz: number): number => TYPICAL_INHARMONICITY.find((entry) => entry.openHz === openHz)?.b ?? Number.NaN;
const E2 = 82.4069;
const A2 = 110;
const D3 = 146.8324;
const G3 = 195.9977;
const E4 = 329.6276;

describe('typical string set', () => {
  it('a plain high E of 0.010 in on 648 mm: tension 72.6 N and B = 1.32·10⁻⁵ (worked by hand from Fletcher 1964, B = π³·E·d⁴/(64·T·L²))', () => {
    // Hand-worked: μ = 7850·π·(0.254 mm)²/4 = 3.978·10⁻⁴ kg/m; T = μ·(2·0.648·329.63)² = 72.6 N;
    // B = 31.006·2·10¹¹·(2.54·10⁻⁴)⁴ / (64·72.6·0.648²) = 1.323·10⁻⁵.
    const highE = TYPICAL_STRING_SET[5];
    expect(highE?.openHz).toBe(E4);
    expect(stringTension(highE!, TYPICAL_STRING_SET_SCALE_M)).toBeCloseTo(72.6, 1);
    expect(bOf(E4)).toBeCloseTo(1.323e-5, 8);
  });

  it('for plain strings B reduces to π²·E·d²/(64·ρ·L⁴·f0²) (Fletcher with Mersenne’s law, derived)', () => {
    for (const wire of TYPICAL_STRING_SET.filter((item) => item.gaugeM === item.coreM)) {
      const closed = (Math.PI ** 2 * STEEL_YOUNGS_MODULUS_PA * wire.coreM ** 2) / (64 * STEEL_DENSITY_KG_PER_M3 * TYPICAL_STRING_SET_SCALE_M ** 4 * wire.openHz ** 2);
      expect(bOf(wire.openHz) / closed).toBeCloseTo(1, 12);
    }
  });

  it('agrees with what Fastl & Völk (2012) measured on electric guitar strings: low wound E2 and A2 above the high E4, a plain G3 above a wound D3', () => {
    expect(bOf(E2)).toBeGreaterThan(bOf(E4));
    expect(bOf(A2)).toBeGreaterThan(bOf(E4));
    expect(bOf(G3)).toBeGreaterThan(bOf(D3));
  });

  it('the same wire on a shorter scale, tuned to the same pitch, has B larger by (L₁/L₂)⁴; tuned down a tone, by (f₁/f₂)²', () => {
    const inch = 0.0254;
    expect(typicalInharmonicity(E2, 24.75 * inch) / typicalInharmonicity(E2, 25.5 * inch)).toBeCloseTo((25.5 / 24.75) ** 4, 12);
    const dropD = 73.4162;
    expect(typicalInharmonicity(dropD, TYPICAL_STRING_SET_SCALE_M) / bOf(E2)).toBeCloseTo((E2 / dropD) ** 2, 12);
    expect(typicalInharmonicity(E2, TYPICAL_STRING_SET_SCALE_M)).toBe(bOf(E2));
  });
});

describe('the string render default', () => {
  it('is stiff: with no options each open string gets the typical set’s B for its pitch and the guitar’s scale', () => {
    const strings: OpenString[] = [E2, A2, D3, G3, 246.9417, E4].map((openHz, index) => ({ index, number: 6 - index, openHz, name: `string ${6 - index}` }));
    const scaleM = 25.5 * 0.0254;
    const resolved = resolveStringOptions({}, strings, scaleM);
    expect(resolved.inharmonicityPerString).toEqual(strings.map((string) => typicalInharmonicity(string.openHz, scaleM)));
    expect(resolveStringOptions({ inharmonicity: 0 }, strings, scaleM).inharmonicityPerString).toEqual([0, 0, 0, 0, 0, 0]);
  });
});
