export { computeCoilSpectra, pickupDelaySamples } from './compute-coil-spectra.js';
export { fillSineSeries } from './sine-series.js';
