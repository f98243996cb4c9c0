/**
 * The parts of render/ that run in any host, the listening page included:
 * the synthesis of wirings from coil signals, the chain designs and their
 * Web Audio graph, WAV encoding. None imports a Node module, so the page's
 * bundle takes them as they are (render/index.ts also re-exports the I/O).
 */
export { designEffectsChain, RENDER_QUANTUM_FRAMES } from '../chain-design.js';
export type { ChainDesign, ChainStage } from '../chain-design.js';
export { CHAIN_NAMES, isChainName, describeChain } from '../chain-name.js';
export type { ChainName } from '../chain-name.js';
export { resolveChainOptions } from '../chain-options.js';
export { connectChainDesign } from '../connect-chain-design.js';
export { runChainDesign } from '../run-chain-design.js';
export type { RenderGraph } from '../run-chain-design.js';
export { designCompressor, renderCompressor } from '../render-compressor.js';
export type { CompressorDesign } from '../render-compressor.js';
export type { ChainContext } from '../connect-chain-design.js';
export { coilSpectraOfSignals, createWiringSynthesis } from '../synthesize-wirings.js';
export type { CoilSignals, CoilSpectra, WiringSynthesis } from '../synthesize-wirings.js';
export { encodeWav } from '../wav-file.js';
