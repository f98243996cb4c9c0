/** ABX trials the page recommends before reading the score (USER-NEEDS.md §(b): at least 10 trials and 95 % confidence, audiocheck.net and gammaelectronics.xyz). */
export const RECOMMENDED_ABX_TRIALS = 10;
/** Guessing probability below which the page says a difference was probably heard (one-sided, 5 %; same sources). */
export const ABX_SIGNIFICANCE = 0.05;
