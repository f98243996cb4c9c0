/**
 * Many small complex linear systems A·x = b of one sparsity pattern, solved
 * together: one per frequency bin of a block (solve-nodal.ts). Each step of
 * the elimination runs as a loop over the block's bins, so the cost of the
 * small n×n loops is paid once per block instead of once per bin.
 *
 * Layout: a block of `stride` bins holds each complex quantity as two runs of
 * `stride` numbers, real parts then imaginary parts. Entry (r, c) of the
 * matrix is quantity r·n + c; entry r of the right-hand side is quantity r.
 *
 * Gaussian elimination in the given order, without row exchanges (Golub &
 * Van Loan, *Matrix Computations*, 4th ed., §3.2, the LU factorisation, and
 * §3.1 for the triangular solves). That needs no pivot to vanish, which
 * holds for the nodal matrices coilbench builds: A = G + jB with G, the
 * conductances, real symmetric positive definite (every unknown node has a
 * conductive path to a node fixed at 0 V, and every coil branch and coupled
 * group has a positive definite real part). Then Re(vᴴ·A·v) = vᵀ·G·v > 0 for
 * every v ≠ 0, so every leading block of A is nonsingular, and so is each
 * pivot of the elimination (derived: a leading block with a null vector v
 * would give vᴴ·A·v = 0). A vanishing pivot (a matrix outside that class)
 * throws.
 */

/** One complex quantity's real and imaginary runs inside a block array. */
export function realAt(quantity: number, stride: number): number {
  return 2 * quantity * stride;
}

export function imagAt(quantity: number, stride: number): number {
  return (2 * quantity + 1) * stride;
}

/**
 * Which entries of the factors are not structurally zero: the entries of
 * `pattern` (n×n, 1 where A may be nonzero) and those the elimination in
 * order fills in (symbolic elimination). The solve skips every other entry.
 */
export function eliminationPattern(pattern: Uint8Array, n: number): Uint8Array {
  const filled = Uint8Array.from(pattern);
  for (let col = 0; col < n; col += 1) {
    for (let r = col + 1; r < n; r += 1) {
      if (filled[r * n + col] === 0) continue;
      for (let c = col + 1; c < n; c += 1) if (filled[col * n + c] === 1) filled[r * n + c] = 1;
    }
  }
  return filled;
}

/**
 * The elimination's steps as lists, read from a filled pattern
 * (`eliminationPattern`): for each pivot column, the rows below it with an
 * entry there, and the columns right of it with an entry in its row. The
 * solve walks these lists instead of testing the pattern, so its loops take
 * the same paths for every pattern (a just-in-time compiler then keeps one
 * compiled form for every graph).
 */
export interface EliminationSteps {
  readonly n: number;
  /** Rows r > col with A[r][col] filled: rows[rowStart[col] … rowStart[col + 1] − 1]. */
  readonly rowStart: Int32Array;
  readonly rows: Int32Array;
  /** Columns c > col with A[col][c] filled: columns[columnStart[col] … columnStart[col + 1] − 1]. */
  readonly columnStart: Int32Array;
  readonly columns: Int32Array;
}

export function eliminationSteps(filled: Uint8Array, n: number): EliminationSteps {
  const rowStart = new Int32Array(n + 1);
  const columnStart = new Int32Array(n + 1);
  const rows: number[] = [];
  const columns: number[] = [];
  for (let col = 0; col < n; col += 1) {
    rowStart[col] = rows.length;
    columnStart[col] = columns.length;
    for (let r = col + 1; r < n; r += 1) if (filled[r * n + col] === 1) rows.push(r);
    for (let c = col + 1; c < n; c += 1) if (filled[col * n + c] === 1) columns.push(c);
  }
  rowStart[n] = rows.length;
  columnStart[n] = columns.length;
  return { n, rowStart, rows: Int32Array.from(rows), columnStart, columns: Int32Array.from(columns) };
}

/** Scratch for one block: the pivots' inverses (n complex runs) and one factor run. */
export interface BlockScratch {
  readonly inverses: Float64Array;
  readonly factor: Float64Array;
}

export function createBlockScratch(n: number, stride: number): BlockScratch {
  return { inverses: new Float64Array(2 * n * stride), factor: new Float64Array(2 * stride) };
}

/**
 * Solve A·x = b for the first `length` bins of the block in place: A (n×n,
 * destroyed) in `matrix`, b in `rhs`, overwritten by x. `steps` are the
 * elimination's steps for A's pattern (`eliminationSteps` of
 * `eliminationPattern`); entries outside them are never read.
 */
export function solveBlock(matrix: Float64Array, rhs: Float64Array, steps: EliminationSteps, length: number, stride: number, scratch: BlockScratch): void {
  const { n, rowStart, rows, columnStart, columns } = steps;
  const { inverses, factor } = scratch;
  for (let col = 0; col < n; col += 1) {
    // The pivot's inverse 1/a = conj(a)/|a|², kept for the back substitution.
    const pr = realAt(col * n + col, stride);
    const pi = imagAt(col * n + col, stride);
    const vr = realAt(col, stride);
    const vi = imagAt(col, stride);
    for (let b = 0; b < length; b += 1) {
      const ar = matrix[pr + b] as number;
      const ai = matrix[pi + b] as number;
      const norm = ar * ar + ai * ai;
      if (!(norm > 0)) throw new RangeError('solveNodalTransfers: singular nodal matrix');
      inverses[vr + b] = ar / norm;
      inverses[vi + b] = -ai / norm;
    }
    for (let at = rowStart[col] as number; at < (rowStart[col + 1] as number); at += 1) {
      const r = rows[at] as number;
      // factor = A[r][col] / A[col][col]
      const er = realAt(r * n + col, stride);
      const ei = imagAt(r * n + col, stride);
      for (let b = 0; b < length; b += 1) {
        const ar = matrix[er + b] as number;
        const ai = matrix[ei + b] as number;
        const ir = inverses[vr + b] as number;
        const ii = inverses[vi + b] as number;
        factor[b] = ar * ir - ai * ii;
        factor[stride + b] = ar * ii + ai * ir;
      }
      for (let to = columnStart[col] as number; to < (columnStart[col + 1] as number); to += 1) {
        const c = columns[to] as number;
        subtractProduct(matrix, realAt(r * n + c, stride), imagAt(r * n + c, stride), factor, matrix, realAt(col * n + c, stride), imagAt(col * n + c, stride), length, stride);
      }
      subtractProduct(rhs, realAt(r, stride), imagAt(r, stride), factor, rhs, realAt(col, stride), imagAt(col, stride), length, stride);
    }
  }
  // Back substitution: x_r = (b_r − Σ_{c>r} U_rc·x_c)/U_rr.
  for (let r = n - 1; r >= 0; r -= 1) {
    const xr = realAt(r, stride);
    const xi = imagAt(r, stride);
    for (let to = columnStart[r] as number; to < (columnStart[r + 1] as number); to += 1) {
      const c = columns[to] as number;
      const ur = realAt(r * n + c, stride);
      const ui = imagAt(r * n + c, stride);
      const yr = realAt(c, stride);
      const yi = imagAt(c, stride);
      for (let b = 0; b < length; b += 1) {
        const ar = matrix[ur + b] as number;
        const ai = matrix[ui + b] as number;
        const sr = rhs[yr + b] as number;
        const si = rhs[yi + b] as number;
        rhs[xr + b] = (rhs[xr + b] as number) - (ar * sr - ai * si);
        rhs[xi + b] = (rhs[xi + b] as number) - (ar * si + ai * sr);
      }
    }
    for (let b = 0; b < length; b += 1) {
      const sr = rhs[xr + b] as number;
      const si = rhs[xi + b] as number;
      const ir = inverses[xr + b] as number;
      const ii = inverses[xi + b] as number;
      rhs[xr + b] = sr * ir - si * ii;
      rhs[xi + b] = sr * ii + si * ir;
    }
  }
}

/** target[t] −= f·source[s] over the block, complex (f's runs at 0 and `stride` of `factor`). */
function subtractProduct(
  target: Float64Array,
  tr: number,
  ti: number,
  factor: Float64Array,
  source: Float64Array,
  sr: number,
  si: number,
  length: number,
  stride: number,
): void {
  for (let b = 0; b < length; b += 1) {
    const fr = factor[b] as number;
    const fi = factor[stride + b] as number;
    const xr = source[sr + b] as number;
    const xi = source[si + b] as number;
    target[tr + b] = (target[tr + b] as number) - (fr * xr - fi * xi);
    target[ti + b] = (target[ti + b] as number) - (fr * xi + fi * xr);
  }
}
