/**
 * Pot tapers: the fraction of the track between the wiper and the grounded
 * end, as a function of the knob setting x from 0 to 10.
 *
 * - linear: r(x) = x/10.
 * - audio: an exponential law r(x) = (b^(x/10) − 1)/(b − 1), which is 0 at 0
 *   and 1 at 10. The base b is fixed by the pot's midpoint: r(5) = a (the
 *   `audioMidpoint`, 0.1 for the common "10 %" pot). With s = √b,
 *   (s − 1)/(s² − 1) = 1/(s + 1) = a, so s = 1/a − 1 and b = (1/a − 1)²
 *   (derived; a = 0.1 gives b = 81). Real carbon tracks are often two linear
 *   segments meeting near the midpoint (common practice); the exponential
 *   law passes through the same three points 0, 5 and 10.
 */
import type { Pot } from '../guitar/index.js';

/** Knob scale: settings run from 0 to 10 (common practice). */
export const KNOB_FULL_SCALE = 10;

/** Base b of the exponential audio law for a pot whose track is at fraction `midpoint` at setting 5 (derived above). */
export function audioTaperBase(midpoint: number): number {
  const root = 1 / midpoint - 1;
  return root * root;
}

/** Fraction of the track between wiper and ground at this setting, 0 to 1. */
export function wiperFraction(pot: Pick<Pot, 'taper' | 'audioMidpoint'>, setting: number): number {
  const x = setting / KNOB_FULL_SCALE;
  if (x <= 0) return 0;
  if (x >= 1) return 1;
  if (pot.taper === 'linear') return x;
  const base = audioTaperBase(pot.audioMidpoint);
  if (Math.abs(base - 1) < Number.EPSILON) return x; // a midpoint of one half is the linear law
  return (base ** x - 1) / (base - 1);
}
