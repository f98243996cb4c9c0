export { coilFrame, computeCoilSpectra, pickupDelaySamples } from './compute-coil-spectra.js';
