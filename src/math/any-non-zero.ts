/**
 * Does `values` hold a non-zero entry? (Which coils a wiring's transfers
 * reach.) A loop of its own, as the engine's other long loops: V8's code
 * compiled for a running loop then has nothing after it to bail out on
 * (src/math/real-fft.ts).
 */
export function anyNonZero(values: Float64Array): boolean {
  for (let k = 0; k < values.length; k += 1) if (values[k] !== 0) return true;
  return false;
}
