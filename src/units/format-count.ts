/**
 * Whole counts written with a comma between groups of three digits
 * ("9,997", "228,386"), as `toLocaleString('en-US')` writes them, without
 * the Intl machinery: its first use costs tens of milliseconds of start-up,
 * paid by every command that builds a message holding a count.
 */

/** Digits between two separators. */
const DIGITS_PER_GROUP = 3;

/** `count` with thousands separators ("9,997"); a number that is not a safe whole number is written as `toLocaleString('en-US')` writes it. */
export function formatCount(count: number): string {
  if (!Number.isSafeInteger(count)) return count.toLocaleString('en-US');
  const digits = String(Math.abs(count));
  let text = '';
  for (let end = digits.length; end > 0; end -= DIGITS_PER_GROUP) {
    const start = Math.max(0, end - DIGITS_PER_GROUP);
    text = text === '' ? digits.slice(start, end) : `${digits.slice(start, end)},${text}`;
  }
  return count < 0 ? `-${text}` : text;
}
