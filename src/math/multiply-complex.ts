/**
 * Complex product in place on interleaved arrays (re, im, re, im, …):
 * target_k ← target_k · factor_k, (a + jb)(c + jd) = (ac − bd) + j(ad + bc).
 */
export function multiplyComplexInPlace(target: Float64Array, factor: Float64Array, length: number = target.length): void {
  for (let i = 0; i < length; i += 2) {
    const ar = target[i] as number;
    const ai = target[i + 1] as number;
    const br = factor[i] as number;
    const bi = factor[i + 1] as number;
    target[i] = ar * br - ai * bi;
    target[i + 1] = ar * bi + ai * br;
  }
}
