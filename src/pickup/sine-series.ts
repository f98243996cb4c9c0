/**
 * sin(k·step) for k = 0 … count − 1, by rotating a unit phasor one step at a
 * time (e^{j(k+1)θ} = e^{jkθ}·e^{jθ}) and resetting it from Math.sin/Math.cos
 * every RESYNC_EVERY steps, so the rounding error stays near 1e-13 while
 * costing a few multiplications per value instead of a sine each.
 */

/** Steps between exact resets of the rotating phasor (error grows about linearly with the run length). */
const RESYNC_EVERY = 256;

export function fillSineSeries(out: Float64Array, step: number, count: number = out.length): Float64Array {
  const stepCos = Math.cos(step);
  const stepSin = Math.sin(step);
  let re = 1;
  let im = 0;
  for (let k = 0; k < count; k += 1) {
    if (k % RESYNC_EVERY === 0) {
      re = Math.cos(k * step);
      im = Math.sin(k * step);
    }
    out[k] = im;
    const nextRe = re * stepCos - im * stepSin;
    im = re * stepSin + im * stepCos;
    re = nextRe;
  }
  return out;
}
