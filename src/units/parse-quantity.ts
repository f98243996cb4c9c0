/**
 * Reads physical quantities as engineers write them: a JSON number in SI base
 * units, or a string with an SI prefix and optional unit ("2.4H", "6.1k",
 * "120p", "22nF", "0.022u", "648mm", "25.5in", "1M", "1meg"), the RKM form
 * where the prefix stands for the decimal point ("6k8", "4n7"; IEC 60062), and
 * three-digit capacitor codes where a capacitance is expected ("473" = 47 nF).
 *
 * Ambiguity is an error, never a guess: a lower-case "m" on a resistance could
 * be milli or mega, so it is refused with a hint; a unitless length could be
 * millimetres or inches, so it is refused too.
 */

/** The kinds of quantity the guitar file and the command line accept. */
export type QuantityKind = 'resistance' | 'capacitance' | 'inductance' | 'length' | 'frequency' | 'voltage';

/** Thrown when text is not a valid quantity of the kind asked for; `expected` completes "expected …". */
export class QuantityError extends Error {
  readonly expected: string;
  constructor(expected: string) {
    super(expected);
    this.name = 'QuantityError';
    this.expected = expected;
  }
}

/** How each kind is named and written, for messages. */
export const QUANTITY_EXAMPLES: Readonly<Record<QuantityKind, string>> = Object.freeze({
  resistance: '"6.1k", "250k" or "1M"',
  capacitance: '"120p", "22n", "0.022u" or the code "223"',
  inductance: '"2.4H" or "2400mH"',
  length: '"648mm" or "25.5in"',
  frequency: '"60Hz" or 60',
  voltage: '"10mV" or "0.01V"',
});

/** SI prefixes by symbol (BIPM, The International System of Units, 9th ed., 2019, Table 7). */
const SI_PREFIX: Readonly<Record<string, number>> = Object.freeze({
  p: 1e-12,
  n: 1e-9,
  u: 1e-6, // the ASCII stand-in for micro, common practice
  'µ': 1e-6, // U+00B5 MICRO SIGN
  'μ': 1e-6, // U+03BC GREEK SMALL LETTER MU
  m: 1e-3,
  k: 1e3,
  K: 1e3, // upper-case kilo on resistor values, common practice
  M: 1e6,
  meg: 1e6, // SPICE spelling of mega
  Meg: 1e6,
  MEG: 1e6,
});

/** Millimetres per inch, exact by definition (international yard and pound agreement, 1959). */
export const METRES_PER_INCH = 0.0254;

interface KindRules {
  /** Unit spellings that may end the text (matched case-sensitively unless listed in lower case in `unitsAnyCase`). */
  readonly units: readonly string[];
  readonly unitsAnyCase: readonly string[];
  /** Prefixes allowed for this kind. */
  readonly prefixes: readonly string[];
  /** May a bare number in a string (no prefix, no unit) stand for base units? */
  readonly bareNumberAllowed: boolean;
}

const RULES: Readonly<Record<Exclude<QuantityKind, 'length'>, KindRules>> = Object.freeze({
  resistance: {
    units: ['\u03A9', '\u2126'], // GREEK CAPITAL OMEGA and OHM SIGN
    unitsAnyCase: ['ohms', 'ohm'],
    prefixes: ['k', 'K', 'M', 'meg', 'Meg', 'MEG'],
    bareNumberAllowed: true,
  },
  capacitance: {
    units: ['F', 'f'],
    unitsAnyCase: [],
    prefixes: ['p', 'n', 'u', 'µ', 'μ'],
    bareNumberAllowed: false,
  },
  inductance: {
    units: ['H', 'h'],
    unitsAnyCase: [],
    prefixes: ['m', 'u', 'µ', 'μ'],
    bareNumberAllowed: true,
  },
  frequency: {
    units: [],
    unitsAnyCase: ['hz'],
    prefixes: ['k'],
    bareNumberAllowed: true,
  },
  voltage: {
    units: ['V', 'v'],
    unitsAnyCase: [],
    prefixes: ['m', 'u', 'µ', 'μ'],
    bareNumberAllowed: true,
  },
});

/** Length units and their size in metres. */
const LENGTH_UNITS: Readonly<Record<string, number>> = Object.freeze({
  m: 1,
  cm: 1e-2,
  mm: 1e-3,
  in: METRES_PER_INCH,
  inch: METRES_PER_INCH,
  inches: METRES_PER_INCH,
  '"': METRES_PER_INCH,
});

const NUMBER_THEN_SUFFIX = /^([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*)$/su;
/** RKM code: digits, a prefix letter standing for the decimal point, digits (IEC 60062). */
const RKM_CODE = /^(\d+)([pnuµμkKM])(\d+)\s*([A-Za-z\u03A9\u2126]*)$/u;
/** Capacitor value code: two significant digits and a count of zeros, in pF, with an optional tolerance letter. */
const CAPACITOR_CODE = /^(\d)(\d)([1-6])[FGJKM]?$/u;
/** Three digits ending in 0 read as a code give 10–99 pF, but people also write plain picofarads this way ("470"): ambiguous. */
const AMBIGUOUS_CODE = /^\d\d0$/u;
/** Picofarads per farad. */
const PICO = 1e-12;
/** Base of the capacitor code's multiplier digit. */
const DECIMAL_BASE = 10;

function describe(kind: QuantityKind): string {
  return `a ${kind} like ${QUANTITY_EXAMPLES[kind]}`;
}

/**
 * Parse a quantity. Numbers are taken as SI base units; strings as described
 * above. Returns the value in SI base units (ohms, farads, henries, metres,
 * hertz). Throws `QuantityError` whose `expected` text completes the message.
 * The sign and size are not checked here; the caller checks its range.
 */
export function parseQuantity(raw: unknown, kind: QuantityKind): number {
  if (typeof raw === 'number') {
    if (!Number.isFinite(raw)) throw new QuantityError(describe(kind));
    return raw;
  }
  if (typeof raw !== 'string') throw new QuantityError(describe(kind));
  const text = raw.trim();
  if (text === '') throw new QuantityError(describe(kind));

  if (kind === 'capacitance') {
    if (AMBIGUOUS_CODE.test(text)) {
      throw new QuantityError(
        `a capacitance with a unit like "${text}p" ("${text}" could be ${text} pF, or the code for ${text.slice(0, 2)} pF)`,
      );
    }
    const code = CAPACITOR_CODE.exec(text);
    if (code) {
      const significant = Number(code[1]) * DECIMAL_BASE + Number(code[2]);
      return significant * DECIMAL_BASE ** Number(code[3]) * PICO;
    }
  }
  if (kind === 'resistance' || kind === 'capacitance') {
    const rkm = RKM_CODE.exec(text);
    if (rkm) {
      const [, whole, prefix, fraction, unit] = rkm;
      return parseQuantity(`${whole}.${fraction}${prefix}${unit}`, kind);
    }
  }

  const match = NUMBER_THEN_SUFFIX.exec(text);
  if (!match) throw new QuantityError(describe(kind));
  const magnitude = Number(match[1]);
  const suffix = (match[2] ?? '').trim();
  if (!Number.isFinite(magnitude)) throw new QuantityError(describe(kind));

  if (kind === 'length') {
    const scale = LENGTH_UNITS[suffix];
    if (scale === undefined) {
      throw new QuantityError(
        suffix === ''
          ? `a length with its unit, like ${QUANTITY_EXAMPLES.length} (a bare number could be millimetres or inches)`
          : describe(kind),
      );
    }
    return magnitude * scale;
  }

  const rules = RULES[kind];
  const prefix = stripUnit(suffix, rules);
  if (prefix === undefined) throw new QuantityError(describe(kind));
  if (prefix === '') {
    if (suffix === '' && !rules.bareNumberAllowed) {
      throw new QuantityError(
        `a ${kind} with a unit or prefix like ${QUANTITY_EXAMPLES[kind]} (a bare number is ambiguous here)`,
      );
    }
    return magnitude;
  }
  if (kind === 'resistance' && prefix === 'm') {
    throw new QuantityError(
      `a resistance without the ambiguous prefix "m" (milli or mega?); write "${match[1]}M" or "${match[1]}meg" for megohms`,
    );
  }
  if (!rules.prefixes.includes(prefix)) throw new QuantityError(describe(kind));
  const factor = SI_PREFIX[prefix];
  if (factor === undefined) throw new QuantityError(describe(kind));
  return magnitude * factor;
}

/** Remove a unit spelling from the end; what is left must be a prefix (or nothing). Undefined if the rest is not a known prefix shape. */
function stripUnit(suffix: string, rules: KindRules): string | undefined {
  for (const unit of rules.units) {
    if (suffix.endsWith(unit)) return suffix.slice(0, suffix.length - unit.length).trim();
  }
  const lower = suffix.toLowerCase();
  for (const unit of rules.unitsAnyCase) {
    if (lower.endsWith(unit)) return suffix.slice(0, suffix.length - unit.length).trim();
  }
  // No unit: the whole suffix must be a prefix. "m" is kept so the caller can name the ambiguity.
  if (suffix === '' || suffix in SI_PREFIX) return suffix;
  return undefined;
}

/** Engineering notation for display: 2350000 → "2.35M", 2.2e-8 → "22n" (SI prefixes, three significant digits). */
export function formatEngineering(value: number, unit = ''): string {
  if (value === 0 || !Number.isFinite(value)) return unit === '' ? `${value}` : `${value} ${unit}`;
  const prefixes: ReadonlyArray<readonly [number, string]> = [
    [1e9, 'G'],
    [1e6, 'M'],
    [1e3, 'k'],
    [1, ''],
    [1e-3, 'm'],
    [1e-6, 'µ'],
    [1e-9, 'n'],
    [1e-12, 'p'],
  ];
  const magnitude = Math.abs(value);
  const [scale, symbol] = prefixes.find(([s]) => magnitude >= s * (1 - 1e-12)) ?? [1e-12, 'p'];
  const scaled = value / scale;
  const digits = Math.abs(scaled) >= 100 ? 0 : Math.abs(scaled) >= 10 ? 1 : 2;
  const fixed = scaled.toFixed(digits);
  const text = fixed.includes('.') ? fixed.replace(/\.?0+$/u, '') : fixed;
  return unit === '' ? `${text}${symbol}` : `${text} ${symbol}${unit}`;
}
