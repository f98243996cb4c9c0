/**
 * Complex products on interleaved arrays (re, im, re, im, …):
 * (a + jb)(c + jd) = (ac − bd) + j(ad + bc).
 */

/** product_k ← a_k · b_k for the first `length` numbers (`product` may be `a` itself). */
export function multiplyComplexInto(a: Float64Array, b: Float64Array, product: Float64Array, length: number = product.length): void {
  for (let i = 0; i < length; i += 2) {
    const ar = a[i] as number;
    const ai = a[i + 1] as number;
    const br = b[i] as number;
    const bi = b[i + 1] as number;
    product[i] = ar * br - ai * bi;
    product[i + 1] = ar * bi + ai * br;
  }
}

/** target_k ← target_k · factor_k, in place. */
export function multiplyComplexInPlace(target: Float64Array, factor: Float64Array, length: number = target.length): void {
  multiplyComplexInto(target, factor, target, length);
}
