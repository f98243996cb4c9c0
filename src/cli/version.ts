/** coilbench's version, as in package.json (a test keeps them equal). */
export const COILBENCH_VERSION = '0.1.0';
