/**
 * A chain design (chain-design.ts) as a Web Audio graph, in any host: the
 * command line runs it in node-web-audio-api's OfflineAudioContext
 * (render-chain-design.ts), the listening page in the browser's own
 * (src/page/wiring-engine.ts), each through runChainDesign
 * (run-chain-design.ts), which keeps the compressor out of the graph. One
 * stage, one node, in order (W3C Web Audio API 1.0: GainNode,
 * BiquadFilterNode, WaveShaperNode).
 */
import { webAudioQ } from './biquad-design.js';
import type { ChainDesign, ChainStage } from './chain-design.js';

/** What a stage needs of an audio node's parameters. */
interface Param {
  value: number;
}

/** The node factories a chain needs, as both hosts' contexts provide them. */
export interface ChainContext<Node> {
  createGain(): Node & { readonly gain: Param };
  createBiquadFilter(): Node & { type: string; readonly frequency: Param; readonly Q: Param; readonly gain: Param };
  createWaveShaper(): Node & { curve: Float32Array<ArrayBuffer> | null; oversample: string };
}

/** One node for one stage, its values set. */
export function createStageNode<Node>(context: ChainContext<Node>, stage: ChainStage): Node {
  switch (stage.kind) {
    case 'gain': {
      const node = context.createGain();
      node.gain.value = stage.gain;
      return node;
    }
    case 'biquad': {
      const node = context.createBiquadFilter();
      node.type = stage.filter.kind;
      node.frequency.value = stage.filter.frequencyHz;
      node.Q.value = webAudioQ(stage.filter);
      node.gain.value = stage.filter.gainDb;
      return node;
    }
    case 'shaper': {
      const node = context.createWaveShaper();
      node.curve = stage.curve;
      node.oversample = stage.oversample;
      return node;
    }
    case 'compressor':
      // Our own code in every host (render-compressor.ts), never a DynamicsCompressorNode: run-chain-design.ts
      // computes it between the graph's parts.
      throw new Error('connectChainDesign: a compressor stage is not a Web Audio node; run the design with runChainDesign');
  }
}

/** Connect `input` through every stage of `design`; returns the last node (the input itself for `direct`). */
export function connectChainDesign<Node extends { connect(destination: never): unknown }>(
  context: ChainContext<Node>,
  design: ChainDesign,
  input: Node,
): Node {
  let last = input;
  for (const stage of design.stages) {
    const node = createStageNode(context, stage);
    (last.connect as (destination: Node) => unknown)(node);
    last = node;
  }
  return last;
}
