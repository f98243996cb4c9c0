/** Random valid coils for property tests (fast-check): invented values spanning common single coils and humbucker halves. */
import fc from 'fast-check';

export const coilArbitrary = fc.record({
  resistance: fc.double({ min: 2e3, max: 16e3, noNaN: true }),
  inductance: fc.double({ min: 1, max: 8, noNaN: true }),
  capacitance: fc.double({ min: 60e-12, max: 250e-12, noNaN: true }),
  winding: fc.constantFrom('cw', 'ccw'),
  magnet: fc.constantFrom('north', 'south'),
  humSensitivity: fc.double({ min: 0.5, max: 1.5, noNaN: true }),
});
