import { describe, expect, it } from 'vitest';
import { QuantityError, formatEngineering, parseQuantity, type QuantityKind } from './parse-quantity.js';

const cases: ReadonlyArray<readonly [unknown, QuantityKind, number]> = [
  ['2.4H', 'inductance', 2.4],
  ['2400mH', 'inductance', 2.4],
  ['2.4', 'inductance', 2.4],
  [2.4, 'inductance', 2.4],
  ['6.1k', 'resistance', 6100],
  ['6k1', 'resistance', 6100], // RKM code, IEC 60062
  ['250K', 'resistance', 250e3],
  ['250 kΩ', 'resistance', 250e3],
  ['250kohm', 'resistance', 250e3],
  ['1M', 'resistance', 1e6],
  ['1meg', 'resistance', 1e6],
  ['1MEG', 'resistance', 1e6],
  ['1 megohm', 'resistance', 1e6],
  ['5900', 'resistance', 5900],
  ['120p', 'capacitance', 120e-12],
  ['120pF', 'capacitance', 120e-12],
  ['22nF', 'capacitance', 22e-9],
  ['22n', 'capacitance', 22e-9],
  ['0.022u', 'capacitance', 22e-9],
  ['0.022µF', 'capacitance', 22e-9],
  ['47000p', 'capacitance', 47e-9],
  ['4n7', 'capacitance', 4.7e-9],
  // Capacitor codes: two digits and a number of zeros, in pF (common practice).
  ['473', 'capacitance', 47e-9],
  ['223', 'capacitance', 22e-9],
  ['104', 'capacitance', 100e-9],
  ['102', 'capacitance', 1e-9],
  ['473J', 'capacitance', 47e-9],
  ['648mm', 'length', 0.648],
  ['64.8cm', 'length', 0.648],
  ['25.5in', 'length', 0.6477], // 1 in = 25.4 mm exactly
  ['25.5"', 'length', 0.6477],
  ['0.648 m', 'length', 0.648],
  [0.648, 'length', 0.648],
  ['60Hz', 'frequency', 60],
  ['1kHz', 'frequency', 1000],
  ['10mV', 'voltage', 0.01],
  ['0.2V', 'voltage', 0.2],
];

describe('parseQuantity', () => {
  it.each(cases)('reads %j as a %s', (text, kind, value) => {
    expect(Math.abs(parseQuantity(text, kind) / value - 1)).toBeLessThan(1e-12);
  });

  const refused: ReadonlyArray<readonly [unknown, QuantityKind, string]> = [
    ['1m', 'resistance', 'ambiguous prefix "m"'],
    ['120', 'capacitance', '"120" could be 120 pF, or the code for 12 pF'],
    ['1200', 'capacitance', 'bare number is ambiguous'],
    ['1M', 'capacitance', 'capacitance like'],
    ['160', 'length', 'millimetres or inches'],
    ['2.4F', 'inductance', 'inductance like'],
    ['lots', 'resistance', 'resistance like'],
    ['', 'resistance', 'resistance like'],
    [null, 'resistance', 'resistance like'],
    [Number.NaN, 'resistance', 'resistance like'],
    ['1e', 'resistance', 'resistance like'],
    ['5 k k', 'resistance', 'resistance like'],
  ];
  it.each(refused)('refuses %j as a %s', (text, kind, message) => {
    expect(() => parseQuantity(text, kind)).toThrow(QuantityError);
    expect(() => parseQuantity(text, kind)).toThrow(message);
  });
});

describe('formatEngineering', () => {
  it.each([
    [2_350_000, 'Ω', '2.35 MΩ'],
    [2.2e-8, 'F', '22 nF'],
    [160, '', '160'],
    [0.1, '', '100m'],
    [470e-12, 'F', '470 pF'],
    [6100, 'Ω', '6.1 kΩ'],
  ] as const)('writes %d %s as %s', (value, unit, text) => {
    expect(formatEngineering(value, unit)).toBe(text);
  });
});
