export { InputError, WorkError, formatProblem, problemAt, showValue } from './input-error.js';
export type { InputProblem } from './input-error.js';
