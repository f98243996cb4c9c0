export { renderEffectsChain, MIN_SAMPLE_RATE_HZ, MAX_SAMPLE_RATE_HZ } from './effects-chain.js';
export { CHAIN_NAMES, describeChain, isChainName, parseChainName } from './chain-name.js';
export type { ChainName } from './chain-name.js';
export { DEFAULT_CHAIN_OPTIONS, resolveChainOptions } from './chain-options.js';
export type { ChainOptions } from './chain-options.js';
export { designEffectsChain } from './chain-design.js';
export type { ChainDesign, ChainStage } from './chain-design.js';
export { measureChainResponse } from './chain-response.js';
