/**
 * Nonlinear least squares by Levenberg–Marquardt with a forward-difference
 * Jacobian (K. Levenberg, Quart. Appl. Math. 2(2), 1944; D. W. Marquardt,
 * J. SIAM 11(2), 1963): minimise Σ r_k(θ)² over θ, each step solving
 * (JᵀJ + λ·diag(JᵀJ))·δ = −Jᵀr and changing λ by factors of 10.
 * Used by the coil fits (src/circuit/fit-coil.ts, fit-coil-to-loads.ts).
 */

/** Fills `out` with the residuals at θ and returns their sum of squares. */
export type ResidualFunction = (theta: readonly number[], out: Float64Array) => number;

export interface LeastSquaresOptions {
  /** Iterations at most (each one Jacobian). */
  readonly maxIterations: number;
}

export interface LeastSquaresResult {
  readonly theta: number[];
  /** Sum of squared residuals at θ. */
  readonly cost: number;
}

/** Relative step for the forward-difference Jacobian (about √ of float64 epsilon). */
const JACOBIAN_STEP = 1e-7;
/** Starting damping and its change per step (Marquardt 1963 uses factors of 10). */
const INITIAL_DAMPING = 1e-3;
const DAMPING_FACTOR = 10;
const MIN_DAMPING = 1e-12;
/** Damping increases tried per iteration before giving up. */
const MAX_DAMPING_STEPS = 30;
/** Stop when a step improves the sum of squares by less than this fraction. */
const CONVERGED_FRACTION = 1e-14;

/** Solve the small dense system A·x = b (Gaussian elimination with partial pivoting); null when singular. */
export function solveLinear(a: readonly (readonly number[])[], b: readonly number[]): number[] | null {
  const n = b.length;
  const m = a.map((row, i) => [...row, b[i] as number]);
  for (let col = 0; col < n; col += 1) {
    let pivot = col;
    for (let row = col + 1; row < n; row += 1) if (Math.abs(m[row]![col]!) > Math.abs(m[pivot]![col]!)) pivot = row;
    if (!(Math.abs(m[pivot]![col]!) > 0)) return null;
    [m[col], m[pivot]] = [m[pivot]!, m[col]!];
    for (let row = col + 1; row < n; row += 1) {
      const factor = m[row]![col]! / m[col]![col]!;
      for (let k = col; k <= n; k += 1) m[row]![k]! -= factor * m[col]![k]!;
    }
  }
  const x = new Array<number>(n).fill(0);
  for (let row = n - 1; row >= 0; row -= 1) {
    let value = m[row]![n]!;
    for (let k = row + 1; k < n; k += 1) value -= m[row]![k]! * (x[k] as number);
    x[row] = value / m[row]![row]!;
  }
  return x;
}

/** Levenberg–Marquardt from `start` over `count` residuals; returns the parameters and their sum of squares. */
export function fitLeastSquares(residuals: ResidualFunction, start: readonly number[], count: number, options: LeastSquaresOptions): LeastSquaresResult {
  const r = new Float64Array(count);
  const trial = new Float64Array(count);
  const shifted = new Float64Array(count);
  let theta = [...start];
  let cost = residuals(theta, r);
  let damping = INITIAL_DAMPING;
  const n = theta.length;
  for (let iteration = 0; iteration < options.maxIterations; iteration += 1) {
    // J[k][j] = ∂r_k/∂θ_j by forward differences
    const jacobian: Float64Array[] = [];
    for (let j = 0; j < n; j += 1) {
      const step = JACOBIAN_STEP * Math.max(1, Math.abs(theta[j] as number));
      const moved = [...theta];
      moved[j] = (moved[j] as number) + step;
      residuals(moved, shifted);
      jacobian.push(Float64Array.from(shifted, (value, k) => (value - (r[k] as number)) / step));
    }
    const normal = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => {
      let sum = 0;
      for (let k = 0; k < count; k += 1) sum += (jacobian[i]![k] as number) * (jacobian[j]![k] as number);
      return sum;
    }));
    const gradient = Array.from({ length: n }, (_, i) => {
      let sum = 0;
      for (let k = 0; k < count; k += 1) sum += (jacobian[i]![k] as number) * (r[k] as number);
      return -sum;
    });
    let improved = false;
    for (let attempt = 0; attempt < MAX_DAMPING_STEPS && !improved; attempt += 1) {
      // (JᵀJ + λ·diag(JᵀJ))·δ = −Jᵀr (Marquardt's scaling)
      const damped = normal.map((row, i) => row.map((value, j) => (i === j ? value * (1 + damping) : value)));
      const delta = solveLinear(damped, gradient);
      if (delta === null) {
        damping *= DAMPING_FACTOR;
        continue;
      }
      const candidate = theta.map((value, i) => value + (delta[i] as number));
      const candidateCost = residuals(candidate, trial);
      if (Number.isFinite(candidateCost) && candidateCost < cost) {
        const gain = (cost - candidateCost) / cost;
        theta = candidate;
        cost = candidateCost;
        r.set(trial);
        damping = Math.max(damping / DAMPING_FACTOR, MIN_DAMPING);
        improved = true;
        if (gain < CONVERGED_FRACTION) return { theta, cost };
      } else {
        damping *= DAMPING_FACTOR;
      }
    }
    if (!improved) break;
  }
  return { theta, cost };
}
