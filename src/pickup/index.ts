export { computeCoilSpectra, pickupDelaySamples } from './compute-coil-spectra.js';
