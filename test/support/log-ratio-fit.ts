/**
 * How two positive measures move together across a set: over every pair
 * (a, b), x = ln(x_a/x_b) and y = ln(y_a/y_b); the least-squares slope of y
 * on x through the origin, Σxy/Σx², and the correlation Σxy/√(Σx²·Σy²).
 */
export function fitLogRatios(xs: readonly number[], ys: readonly number[]): { slope: number; correlation: number } {
  let xy = 0;
  let xx = 0;
  let yy = 0;
  for (let a = 0; a < xs.length; a += 1) {
    for (let b = a + 1; b < xs.length; b += 1) {
      const x = Math.log((xs[a] as number) / (xs[b] as number));
      const y = Math.log((ys[a] as number) / (ys[b] as number));
      xy += x * y;
      xx += x * x;
      yy += y * y;
    }
  }
  return { slope: xy / xx, correlation: xy / Math.sqrt(xx * yy) };
}
