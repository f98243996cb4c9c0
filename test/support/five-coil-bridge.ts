/**
 * The five-coil bridge network the nodal checks run on: five unlike coils
 * and the Wheatstone-like connection no series–parallel expression writes.
 */
import type { CircuitGraph } from '../../src/circuit/index.js';
import { type Guitar, parseGuitar } from '../../src/guitar/index.js';

/** Five unlike coils (invented values, within docs/physics.md §1.3). */
export const FIVE_COILS: Guitar = parseGuitar({
  name: 'five-coil bridge check (invented values)',
  coils: [
    { id: 'neck', position: '160mm', resistance: '5.9k', inductance: '2.35H', capacitance: '110p', winding: 'cw', magnet: 'north' },
    { id: 'mid_neck', position: '130mm', resistance: '6.3k', inductance: '2.6H', capacitance: '118p', winding: 'ccw', magnet: 'south' },
    { id: 'mid', position: '100mm', resistance: '7.1k', inductance: '3.0H', capacitance: '130p', winding: 'cw', magnet: 'north' },
    { id: 'mid_bridge', position: '70mm', resistance: '4.2k', inductance: '2.2H', capacitance: '145p', winding: 'ccw', magnet: 'north' },
    { id: 'bridge', position: '40mm', resistance: '8.1k', inductance: '3.6H', capacitance: '150p', winding: 'cw', magnet: 'south' },
  ],
  controls: { volume: { pot: '250k', setting: 10, taper: 'audio' }, tone: { pot: '250k', capacitor: '22n', setting: 10 } },
  cable: { capacitance: '470p' },
  amp: { resistance: '1M', capacitance: '50p' },
});

/**
 * hot ─neck─ a ─mid─ ground, hot ─mid_neck─ b ─bridge─ ground, and mid_bridge
 * across a–b: the bridge network. Nodes 0 ground, 1 hot, 2 a, 3 b.
 */
export const BRIDGE_GRAPH: CircuitGraph = {
  nodeCount: 4,
  ground: 0,
  hot: 1,
  nodeNames: ['ground', 'hot', 'a', 'b'],
  coils: [
    { coil: 0, start: 2, finish: 1 },
    { coil: 1, start: 1, finish: 3 },
    { coil: 2, start: 0, finish: 2 },
    { coil: 3, start: 2, finish: 3 },
    { coil: 4, start: 3, finish: 0 },
  ],
};

