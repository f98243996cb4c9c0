/** ABX trials the page recommends before reading the score (at least 10 trials and a 5 % guessing probability: common practice for ABX, docs/sources.md). */
export const RECOMMENDED_ABX_TRIALS = 10;
/** Guessing probability below which the page says a difference was probably heard (one-sided, 5 %; same sources). */
export const ABX_SIGNIFICANCE = 0.05;
