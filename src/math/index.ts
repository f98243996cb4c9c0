export { realFft, nextPowerOfTwo, binFrequencyHz } from './real-fft.js';
export type { RealFft } from './real-fft.js';
export { createRandom, seedFromText } from './random.js';
export type { Random } from './random.js';
export { maxOf, minOf, appendAll } from './extremes.js';
export { runSteps } from './run-steps.js';
export type { Steps } from './run-steps.js';
export { fitLeastSquares, solveLinear } from './fit-least-squares.js';
export type { LeastSquaresOptions, LeastSquaresResult, ResidualFunction } from './fit-least-squares.js';
