/**
 * Run by src/render/effects-chain.test.ts in a child process: render a 3 s
 * tone through every chain, print one line, and end without calling
 * process.exit — the test checks that the process ends by itself (no audio
 * context or thread left open).
 */
import { CHAIN_NAMES, renderEffectsChain } from '../../src/render/index.js';
import { makePluck } from './tone-measures.js';

const SAMPLE_RATE_HZ = 48_000;
const input = makePluck(110, 0.2, 3, SAMPLE_RATE_HZ);
const lengths: number[] = [];
for (const chain of CHAIN_NAMES) lengths.push((await renderEffectsChain(input, SAMPLE_RATE_HZ, chain)).length);
console.log(`rendered ${lengths.join(' ')}`);
