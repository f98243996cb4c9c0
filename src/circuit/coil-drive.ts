/**
 * How the strings drive the coils: the coils' EMF cross-spectra, normalised
 * to the mean coil signal,
 *
 *   D_ij(f) = S_ij(f) / ((1/n)·Σ_i S_ii(f)),   S_ij(f) = Σ_{k∈band(f)} E_i(f_k)·conj(E_j(f_k)),
 *
 * on a grid of frequencies (docs/physics.md, "The response as the string
 * drives it"). The circuit only takes D as given; src/analysis/
 * measure-coil-drive.ts makes it from the reference phrase. D is Hermitian
 * (D_ji = conj(D_ij)), so only the pairs i ≤ j are kept, in the order
 * (0,0), (0,1), …, (0,n−1), (1,1), … (`drivePairIndex`).
 *
 * D = I (the identity, `incoherentCoilDrive`) describes coils of equal level
 * with uncorrelated signals; the driven response (driven-response.ts) then
 * reduces to the power sum √(Σ_i |T_i|²).
 */

export interface CoilDrive {
  readonly coilCount: number;
  /** n(n+1)/2 pairs i ≤ j. */
  readonly pairCount: number;
  /** Ascending, > 0, at least one. Outside them D is held at the nearest end. */
  readonly frequenciesHz: Float64Array;
  /** D per frequency and pair, interleaved complex: index 2·(k·pairCount + pair). */
  readonly cross: Float64Array;
}

/** Index of pair (i, j), i ≤ j, among n coils. */
export function drivePairIndex(i: number, j: number, coilCount: number): number {
  return i * coilCount - (i * (i - 1)) / 2 + (j - i);
}

/** D = I at every frequency: equal, uncorrelated coils (the power sum). */
export function incoherentCoilDrive(coilCount: number): CoilDrive {
  if (!Number.isInteger(coilCount) || coilCount < 1) throw new RangeError(`incoherentCoilDrive: coilCount must be a positive integer, got ${coilCount}`);
  const pairCount = (coilCount * (coilCount + 1)) / 2;
  const cross = new Float64Array(2 * pairCount);
  for (let i = 0; i < coilCount; i += 1) cross[2 * drivePairIndex(i, i, coilCount)] = 1;
  return { coilCount, pairCount, frequenciesHz: Float64Array.of(1), cross };
}

/**
 * D at `frequencyHz`, written into `out` (2·pairCount numbers): a cubic
 * Hermite spline in x = ln f through the drive's points, with the
 * finite-difference tangents m_k = (D_{k+1} − D_{k−1})/(x_{k+1} − x_{k−1})
 * (one-sided at the ends), held constant outside them. Smooth (C¹), so
 * R(f) has no kinks at the drive's points for a peak search to lock onto.
 *   D(x) = h00(t)·D_k + h10(t)·Δx·m_k + h01(t)·D_{k+1} + h11(t)·Δx·m_{k+1},
 *   h00 = 2t³ − 3t² + 1, h10 = t³ − 2t² + t, h01 = −2t³ + 3t², h11 = t³ − t²
 * (the cubic Hermite basis; Fritsch & Carlson 1980, SIAM J. Numer. Anal. 17(2)).
 */
export function coilDriveAt(drive: CoilDrive, frequencyHz: number, out: Float64Array): Float64Array {
  const { frequenciesHz: grid, pairCount, cross } = drive;
  const width = 2 * pairCount;
  const last = grid.length - 1;
  const hold = (k: number): Float64Array => {
    for (let p = 0; p < width; p += 1) out[p] = cross[k * width + p] as number;
    return out;
  };
  if (last === 0 || frequencyHz <= (grid[0] as number)) return hold(0);
  if (frequencyHz >= (grid[last] as number)) return hold(last);
  // binary search for grid[from] ≤ f < grid[from + 1]
  let low = 0;
  let high = last;
  while (high - low > 1) {
    const middle = (low + high) >> 1;
    if ((grid[middle] as number) <= frequencyHz) low = middle;
    else high = middle;
  }
  const x = (k: number): number => Math.log(grid[k] as number);
  const x0 = x(low);
  const x1 = x(low + 1);
  const dx = x1 - x0;
  const t = (Math.log(frequencyHz) - x0) / dx;
  const t2 = t * t;
  const t3 = t2 * t;
  const h00 = 2 * t3 - 3 * t2 + 1;
  const h10 = t3 - 2 * t2 + t;
  const h01 = -2 * t3 + 3 * t2;
  const h11 = t3 - t2;
  const before = Math.max(0, low - 1);
  const after = Math.min(last, low + 2);
  const spanBefore = x1 - x(before);
  const spanAfter = x(after) - x0;
  for (let p = 0; p < width; p += 1) {
    const d0 = cross[low * width + p] as number;
    const d1 = cross[(low + 1) * width + p] as number;
    const m0 = ((d1 - (cross[before * width + p] as number)) / spanBefore) * dx;
    const m1 = (((cross[after * width + p] as number) - d0) / spanAfter) * dx;
    out[p] = h00 * d0 + h10 * m0 + h01 * d1 + h11 * m1;
  }
  return out;
}

/** D sampled at each of `frequenciesHz`, laid out as `CoilDrive.cross`. */
export function sampleCoilDrive(drive: CoilDrive, frequenciesHz: Float64Array): Float64Array {
  const width = 2 * drive.pairCount;
  const out = new Float64Array(width * frequenciesHz.length);
  frequenciesHz.forEach((frequency, k) => coilDriveAt(drive, frequency, out.subarray(k * width, (k + 1) * width)));
  return out;
}

/**
 * R² = Σ_i Σ_j p_i·p_j·T⁰_i·D_ij·conj(T⁰_j) / ((1/m)·Σ_{i used} D_ii) at
 * grid index `index` of the in-phase transfers T⁰ (T_i = p_i·T⁰_i,
 * src/wiring/network-phases.ts), with D at `driveOffset` of `drive` (a
 * sampled drive), the m coils the wiring uses (p_i ≠ 0) setting the mean
 * coil signal. By Hermitian symmetry the pairs i > j fold onto i < j:
 * Σ_ij = Σ_i |T_i|²·D_ii + 2·Σ_{i<j} Re(T_i·D_ij·conj(T_j)).
 */
export function drivenPowerAt(
  transfers: readonly Float64Array[],
  index: number,
  phases: Float64Array,
  drive: Float64Array,
  driveOffset: number,
): number {
  const n = transfers.length;
  const at = 2 * index;
  let sum = 0;
  let diagonal = 0;
  let used = 0;
  let pair = 0;
  for (let i = 0; i < n; i += 1) {
    const ti = transfers[i] as Float64Array;
    const ir = ti[at] as number;
    const ii = ti[at + 1] as number;
    const pi = phases[i] as number;
    if (pi !== 0) {
      diagonal += drive[driveOffset + 2 * pair] as number;
      used += 1;
    }
    for (let j = i; j < n; j += 1) {
      const tj = transfers[j] as Float64Array;
      const jr = tj[at] as number;
      const ji = tj[at + 1] as number;
      // a = T_i·conj(T_j); Re(a·D) = a_r·D_r − a_i·D_i
      const ar = ir * jr + ii * ji;
      const ai = ii * jr - ir * ji;
      const d = driveOffset + 2 * pair;
      const term = ar * (drive[d] as number) - ai * (drive[d + 1] as number);
      sum += (i === j ? 1 : 2) * pi * (phases[j] as number) * term;
      pair += 1;
    }
  }
  if (!(diagonal > 0)) return 0;
  // A sum of powers is never negative; rounding can leave −1e-30 where coils cancel exactly.
  return Math.max(0, sum) / (diagonal / used);
}
