/**
 * Largest and smallest of many numbers without spreading them into
 * Math.max/Math.min arguments (a spread of a few hundred thousand values
 * overflows the call stack). Same answers as Math.max/Math.min: NaN if any
 * value is NaN; −∞ (max) or +∞ (min) for no values.
 */

/** The largest value: Math.max over an iterable of any length. */
export function maxOf(values: Iterable<number>): number {
  let found = Number.NEGATIVE_INFINITY;
  for (const value of values) {
    if (Number.isNaN(value)) return Number.NaN;
    if (value > found) found = value;
  }
  return found;
}

/** The smallest value: Math.min over an iterable of any length. */
export function minOf(values: Iterable<number>): number {
  let found = Number.POSITIVE_INFINITY;
  for (const value of values) {
    if (Number.isNaN(value)) return Number.NaN;
    if (value < found) found = value;
  }
  return found;
}

/** Append every item of `items` to `target` (in place of `target.push(...items)`); returns `target`. */
export function appendAll<T>(target: T[], items: Iterable<T>): T[] {
  for (const item of items) target.push(item);
  return target;
}
