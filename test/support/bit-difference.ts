/**
 * Where two arrays of floating-point numbers first differ in any bit (the
 * sign of zero and a NaN's bits included): the index, or −1 when they are the
 * same to the last bit. For the tests that hold a WebAssembly kernel to the
 * JavaScript it stands for; an index rather than a diff of every element, so a
 * failure over 100,000 numbers stays quick to print.
 */
export function firstBitDifference(expected: Float32Array | Float64Array, got: Float32Array | Float64Array): number {
  if (expected.length !== got.length || expected.BYTES_PER_ELEMENT !== got.BYTES_PER_ELEMENT) return 0;
  const wide = expected instanceof Float64Array;
  const a = wide ? new BigUint64Array(expected.buffer, expected.byteOffset, expected.length) : new Uint32Array(expected.buffer, expected.byteOffset, expected.length);
  const b = wide ? new BigUint64Array(got.buffer, got.byteOffset, got.length) : new Uint32Array(got.buffer, got.byteOffset, got.length);
  for (let n = 0; n < a.length; n += 1) if (a[n] !== b[n]) return n;
  return -1;
}
