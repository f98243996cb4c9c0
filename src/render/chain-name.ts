/**
 * The effects chains a render can go through, and their plain-language
 * descriptions for reports and the listening page.
 */
import { InputError, oneOfChoices } from '../errors/index.js';

/** `direct`: the output jack as is; `clean`, `drive`, `compressed`: through a modelled amplifier and cabinet. */
export type ChainName = 'direct' | 'clean' | 'drive' | 'compressed';

/** Every chain, in the order reports list them. */
export const CHAIN_NAMES: readonly ChainName[] = Object.freeze(['direct', 'clean', 'drive', 'compressed']);

const DESCRIPTIONS: Readonly<Record<ChainName, string>> = Object.freeze({
  direct: 'direct output of the guitar jack, no processing',
  clean: 'clean amplifier tone stack and speaker cabinet',
  drive: 'overdriven amplifier (soft clipping, 4× oversampled) with tone stack and speaker cabinet',
  compressed: 'compressor (4:1) before the clean amplifier tone stack and speaker cabinet',
});

/** One line saying what a chain does, for reports and pages. */
export function describeChain(name: ChainName): string {
  return DESCRIPTIONS[name];
}

/** True when `text` names a chain. */
export function isChainName(text: unknown): text is ChainName {
  return typeof text === 'string' && (CHAIN_NAMES as readonly string[]).includes(text);
}

/** Read a chain name from user input (`--chain`); throws InputError at `path` otherwise. */
export function parseChainName(text: unknown, path = '--chain'): ChainName {
  if (isChainName(text)) return text;
  throw InputError.at(path, oneOfChoices(text, CHAIN_NAMES), text);
}
