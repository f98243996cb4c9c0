import { describe, expect, it } from 'vitest';
import { fillSineSeries } from './sine-series.js';

describe('fillSineSeries', () => {
  it('matches Math.sin(k·step) over long runs, to 1e-12 plus the rounding of the argument k·step itself', () => {
    for (const step of [1e-4, 0.0123, 1.7, 3.1]) {
      const out = fillSineSeries(new Float64Array(131073), step);
      let worst = 0;
      out.forEach((value, k) => {
        const argumentRounding = 2 * Number.EPSILON * k * step;
        worst = Math.max(worst, Math.abs(value - Math.sin(k * step)) / (1e-12 + argumentRounding));
      });
      expect(worst).toBeLessThan(1);
    }
  });
});
