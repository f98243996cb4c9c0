/**
 * A SPICE netlist of one wiring with the guitar's load, in plain ngspice
 * syntax, so anyone can check coilbench's figures in their own simulator:
 * one AC source per coil (its string signal) with the coil's L, R and
 * self-capacitance, the controls, cable and amplifier, an `.ac` sweep and a
 * `.print ac` of the output in dB and degrees (`ngspice -b file.cir`).
 *
 * Values are written as plain numbers in SI units (12 significant digits),
 * never with SPICE suffixes, because SPICE reads "M" as
 * milli (ngspice manual, §2.3 "Values": "M" = 1e-3, "MEG" = 1e6).
 *
 * Each coil: start ─ V (EMF) ─ L ─ R ─ finish, C from start to finish. The
 * source's value is the string EMF from start to finish, so its sign is w·m
 * (coil-signs.ts): "AC 1 0" or "AC 1 180". The wiring's connection then puts
 * the finish or the start lead towards hot, which turns it into p.
 *
 * Coupled coils (coil-coupling.ts) get a `K` line naming their inductors,
 * with coefficient sign·k: each L is written from the start side to the
 * finish side, so SPICE's dot convention (mutual M = K·√(L1·L2) with both
 * currents entering the first node) reads start to finish as the solver does.
 */
import type { Coil, Guitar } from '../guitar/index.js';
import type { Network, Wiring } from '../wiring/index.js';
import { magnetSign, windingSign } from './coil-signs.js';
import { type CircuitLoad, type CircuitOverrides, resolveCircuitLoad } from './circuit-load.js';
import type { CoilModel } from './coil-model.js';
import { AUDIO_BAND_HIGH_HZ, AUDIO_BAND_LOW_HZ } from './frequency-grid.js';
import type { CircuitGraph } from './circuit-graph.js';
import { type CoilCoupling, coilCouplings, mutualInductanceH } from './coil-coupling.js';
import { GROUND_NODE, HOT_NODE, layoutWiring } from './layout-wiring.js';
import { appendAll } from '../math/index.js';

/** A source's AC value: magnitude and phase in degrees. */
export interface SourcePhasor {
  readonly magnitude: number;
  readonly phaseDeg: number;
}

export interface NetlistOptions {
  /** Sweep points per decade (`.ac dec N …`). Default 20, which gives 61 points over 20 Hz–20 kHz. */
  readonly pointsPerDecade: number;
  /** Sweep start and stop, Hz. Default 20 Hz and 20 kHz. */
  readonly startHz: number;
  readonly stopHz: number;
  /**
   * Each coil's string EMF (guitar.coils order), acoustic polarity +1. Default
   * 1∠0° for every coil: equal string signals, so the output is Σ_i T_i.
   */
  readonly sourcePhasors: readonly SourcePhasor[] | null;
}

export const DEFAULT_NETLIST_OPTIONS: Readonly<NetlistOptions> = Object.freeze({
  pointsPerDecade: 20,
  startHz: AUDIO_BAND_LOW_HZ,
  stopHz: AUDIO_BAND_HIGH_HZ,
  sourcePhasors: null,
});

/** SPICE's ground node. */
const SPICE_GROUND = '0';
const OUTPUT_NODE = 'out';
const HALF_TURN_DEG = 180;

/** Significant digits written: 12 keeps every value within 1e-12 of the float64 the solver uses, far inside the checks' tolerances. */
const SIGNIFICANT_DIGITS = 12;

/** A number as ngspice reads it: plain decimal or exponent form, no suffix. */
function spiceNumber(value: number): string {
  if (!Number.isFinite(value)) throw new RangeError(`renderNetlist: cannot write ${value}`);
  return String(Number(value.toPrecision(SIGNIFICANT_DIGITS)));
}

/** ASCII-only comment text (some simulators choke on other characters). */
function asciiText(text: string): string {
  return text
    .replace(/Ω/gu, 'ohm')
    .replace(/µ/gu, 'u')
    .replace(/[–—]/gu, '-')
    .replace(/→/gu, '->')
    .replace(/[^\x20-\x7e]/gu, '?');
}

/** Instance and node names from coil ids: letters, digits and "_" only, unique regardless of case (SPICE ignores case). */
function spiceNames(coils: readonly Coil[]): string[] {
  const seen = new Set<string>();
  return coils.map((coil) => {
    let name = coil.id.replace(/[^A-Za-z0-9_]/gu, '_');
    if (seen.has(name.toLowerCase())) name = `${name}_${coil.index + 1}`;
    seen.add(name.toLowerCase());
    return name;
  });
}

/** Comment text for a coil's losses. */
function lossText(coil: CoilModel): string {
  const parts: string[] = [];
  if (coil.eddyShare > 0) parts.push(`eddy branch ${spiceNumber(coil.eddyShare)} of L with ${spiceNumber(coil.eddyResistanceOhms)} ohm`);
  if (coil.lossResistanceOhms !== null) parts.push(`loss resistance ${spiceNumber(coil.lossResistanceOhms)} ohm`);
  return parts.length > 0 ? `, ${parts.join(', ')}` : '';
}

/**
 * The coil's elements after its EMF source (node `${name}_emf`), as in
 * coil-model.ts: L·(1−κ), then κ·L ∥ Re (the eddy branch), then R to the
 * finish lead; C and the loss resistance Rp from start to finish.
 */
export function coilElementLines(coil: CoilModel, name: string, startNode: string, finishNode: string): string[] {
  const lines: string[] = [];
  const kappa = coil.eddyShare;
  lines.push(`L${name} ${name}_emf ${name}_l ${spiceNumber(coil.inductanceH * (1 - kappa))}`);
  let resistorStart = `${name}_l`;
  if (kappa > 0) {
    lines.push(
      `L${name}__eddy ${name}_l ${name}_e ${spiceNumber(coil.inductanceH * kappa)}`,
      `R${name}__eddy ${name}_l ${name}_e ${spiceNumber(coil.eddyResistanceOhms)}`,
    );
    resistorStart = `${name}_e`;
  }
  lines.push(
    `R${name} ${resistorStart} ${finishNode} ${spiceNumber(coil.resistanceOhms)}`,
    `C${name} ${startNode} ${finishNode} ${spiceNumber(coil.capacitanceF)}`,
  );
  if (coil.lossResistanceOhms !== null) lines.push(`R${name}__loss ${startNode} ${finishNode} ${spiceNumber(coil.lossResistanceOhms)}`);
  return lines;
}

/** One coil as the netlist places it: its nodes (SPICE names) and a comment line. */
interface NetlistCoil {
  readonly coil: Coil;
  readonly startNode: string;
  readonly finishNode: string;
  readonly comment: string;
}

function checkNetlistOptions(settings: NetlistOptions): void {
  if (!Number.isInteger(settings.pointsPerDecade) || settings.pointsPerDecade < 1) {
    throw new RangeError(`renderNetlist: pointsPerDecade must be a positive integer, got ${settings.pointsPerDecade}`);
  }
  if (!(settings.startHz > 0) || !(settings.stopHz > settings.startHz)) {
    throw new RangeError(`renderNetlist: need 0 < startHz < stopHz, got ${settings.startHz}, ${settings.stopHz}`);
  }
}

/** A node name as SPICE reads it: hot stays, ground is 0, anything else letters, digits and "_". */
function spiceNode(name: string): string {
  if (name === HOT_NODE) return HOT_NODE;
  if (name === GROUND_NODE) return SPICE_GROUND;
  return name.replace(/[^A-Za-z0-9_]/gu, '_');
}

/**
 * The netlist text of a wiring of `guitar`, with the load after `overrides`.
 * Throws InputError for a bad override.
 */
export function renderNetlist(
  guitar: Guitar,
  wiring: Pick<Wiring, 'network' | 'expression' | 'description'> & { readonly id?: string },
  overrides?: CircuitOverrides,
  options: Partial<NetlistOptions> = {},
): string {
  const settings = { ...DEFAULT_NETLIST_OPTIONS, ...options };
  checkNetlistOptions(settings);
  const load = resolveCircuitLoad(guitar, overrides);
  const network: Network = wiring.network;
  const layout = layoutWiring(guitar, network);
  const label = wiring.id ? `${wiring.id}: ${wiring.expression}` : wiring.expression;
  const coils = layout.placements.map((placement): NetlistCoil => {
    const { coil } = placement;
    const inside = placement.element.kind === 'two-lead pickup' ? ` (inside two-lead pickup ${placement.element.id})` : '';
    return {
      coil,
      startNode: spiceNode(placement.plusLead === 'start' ? placement.plusNode : placement.minusNode),
      finishNode: spiceNode(placement.plusLead === 'finish' ? placement.plusNode : placement.minusNode),
      comment:
        `* coil ${coil.id}${inside}: ${spiceNumber(coil.resistanceOhms)} ohm, ${spiceNumber(coil.inductanceH)} H, ` +
        `${spiceNumber(coil.capacitanceF)} F${lossText(coil)}; winding ${coil.winding}, ${coil.magnet} up; ` +
        `${placement.phase === 1 ? 'in phase' : 'out of phase'}: ${placement.plusLead} lead at ${spiceNode(placement.plusNode)}, ` +
        `${placement.minusLead} lead at ${spiceNode(placement.minusNode)}`,
    };
  });
  return netlistText(guitar, label, wiring.description, coils, layout.unused, load, settings);
}

/**
 * The netlist text of any connection of coil leads (a `CircuitGraph`): the
 * same elements, load and sweep as `renderNetlist`. Nodes are named by
 * `graph.nodeNames` (else n1, n2, …); hot is "hot", ground "0". Coils with a
 * floating lead are listed as not connected.
 */
export function renderGraphNetlist(
  guitar: Guitar,
  graph: CircuitGraph,
  label: string,
  overrides?: CircuitOverrides,
  options: Partial<NetlistOptions> = {},
): string {
  const settings = { ...DEFAULT_NETLIST_OPTIONS, ...options };
  checkNetlistOptions(settings);
  const load = resolveCircuitLoad(guitar, overrides);
  const used = new Set<number>();
  const names = new Map<number, string>();
  const taken = new Set<string>([HOT_NODE, SPICE_GROUND, OUTPUT_NODE]);
  const nodeName = (index: number): string => {
    if (index === graph.ground) return SPICE_GROUND;
    if (index === graph.hot) return HOT_NODE;
    const known = names.get(index);
    if (known !== undefined) return known;
    let name = spiceNode(graph.nodeNames?.[index] ?? `n${index}`);
    if (name === '' || taken.has(name.toLowerCase())) name = `n${index}_${name}`;
    taken.add(name.toLowerCase());
    names.set(index, name);
    return name;
  };
  const coils: NetlistCoil[] = [];
  for (const placed of graph.coils) {
    if (placed.start === null || placed.finish === null) continue;
    const coil = guitar.coils[placed.coil];
    if (coil === undefined) throw new RangeError(`renderGraphNetlist: no coil ${placed.coil} in this guitar`);
    used.add(coil.index);
    const startNode = nodeName(placed.start);
    const finishNode = nodeName(placed.finish);
    coils.push({
      coil,
      startNode,
      finishNode,
      comment:
        `* coil ${coil.id}: ${spiceNumber(coil.resistanceOhms)} ohm, ${spiceNumber(coil.inductanceH)} H, ` +
        `${spiceNumber(coil.capacitanceF)} F${lossText(coil)}; winding ${coil.winding}, ${coil.magnet} up; start lead at ${startNode}, finish lead at ${finishNode}`,
    });
  }
  const unused = guitar.coils.filter((coil) => !used.has(coil.index));
  const description = graph.hot === graph.ground ? 'Hot is grounded: nothing reaches the amplifier.' : 'A connection of coil leads.';
  return netlistText(guitar, label, description, coils, unused, load, settings);
}

/**
 * The K value SPICE needs: M = K·√(L1'·L2') over the inductors the netlist
 * names, which hold L·(1−κ) of each coil (the rest is the eddy branch,
 * coil-model.ts), so K = M/√(L1'·L2') with M = sign·k·√(L1·L2) as the
 * solver uses it (coil-coupling.ts).
 */
function spiceCouplingCoefficient(guitar: Guitar, pair: CoilCoupling): number {
  const first = guitar.coils[pair.first] as Coil;
  const second = guitar.coils[pair.second] as Coil;
  const named = Math.sqrt(first.inductanceH * (1 - first.eddyShare) * second.inductanceH * (1 - second.eddyShare));
  return mutualInductanceH(guitar, pair) / named;
}

function netlistText(
  guitar: Guitar,
  label: string,
  description: string,
  coils: readonly NetlistCoil[],
  unusedCoils: readonly Coil[],
  load: CircuitLoad,
  settings: NetlistOptions,
): string {
  const names = spiceNames(guitar.coils);
  const lines: string[] = [];
  // The first line of a SPICE netlist is its title.
  lines.push(asciiText(`coilbench: ${guitar.name} - ${label}`));
  lines.push(
    asciiText(`* ${description}`),
    '* Written by coilbench. A model, not a measurement.',
    '* Each coil: its string EMF (the AC source; 1 = equal string signals for every coil) in series with',
    '* its inductance, an eddy-current branch (part of the inductance in parallel with a resistor) and its',
    '* resistance; its self-capacitance (and any loss resistance) across its leads. The AC value is the EMF seen',
    '* from the start lead to the finish lead: its sign is winding x magnet (cw = +1, north up = +1).',
    '* Nodes: hot = volume pot input, out = amplifier input, 0 = ground, j* = joints between coils.',
    '',
  );
  for (const { coil, startNode, finishNode, comment } of coils) {
    const name = names[coil.index] as string;
    const phasor = settings.sourcePhasors?.[coil.index] ?? { magnitude: 1, phaseDeg: 0 };
    const stringSign = windingSign(coil.winding) * magnetSign(coil.magnet);
    const phaseDeg = phasor.phaseDeg + (stringSign < 0 ? HALF_TURN_DEG : 0);
    lines.push(asciiText(comment), `V${name} ${name}_emf ${startNode} DC 0 AC ${spiceNumber(phasor.magnitude)} ${spiceNumber(phaseDeg)}`);
    appendAll(lines, coilElementLines(coil, name, startNode, finishNode));
  }
  const present = new Set(coils.map(({ coil }) => coil.index));
  for (const pair of coilCouplings(guitar)) {
    if (!present.has(pair.first) || !present.has(pair.second)) continue;
    const first = names[pair.first] as string;
    const second = names[pair.second] as string;
    lines.push(
      asciiText(
        `* coils ${guitar.coils[pair.first]?.id} and ${guitar.coils[pair.second]?.id} share flux: coupling ${spiceNumber(pair.coefficient)}, ` +
          `mutual inductance ${spiceNumber(mutualInductanceH(guitar, pair))} H with both inductors read from start to finish`,
      ),
      `K${first}_${second} L${first} L${second} ${spiceNumber(spiceCouplingCoefficient(guitar, pair))}`,
    );
  }
  if (unusedCoils.length > 0) {
    lines.push(asciiText(`* not used, disconnected: ${unusedCoils.map((coil) => coil.id).join(', ')}`));
  }
  const { volume, tone, trebleBleed } = load;
  lines.push(
    '',
    `* Volume pot ${spiceNumber(volume.potOhms)} ohm, ${volume.taper} taper, setting ${volume.setting} ` +
      `(wiper at ${spiceNumber(volume.wiperFraction)} of the track from ground): track from hot to ground, wiper to the output.`,
  );
  if (volume.topOhms > 0) lines.push(`Rvolume_top ${HOT_NODE} ${OUTPUT_NODE} ${spiceNumber(volume.topOhms)}`);
  else lines.push(`Vvolume_top ${HOT_NODE} ${OUTPUT_NODE} DC 0 ; fully up: the wiper sits at the hot end (a 0 V source is a short)`);
  if (volume.bottomOhms > 0) lines.push(`Rvolume_bottom ${OUTPUT_NODE} ${SPICE_GROUND} ${spiceNumber(volume.bottomOhms)}`);
  else lines.push(`Vvolume_bottom ${OUTPUT_NODE} ${SPICE_GROUND} DC 0 ; fully down: the output is shorted to ground, nothing reaches the amplifier`);
  if (tone) {
    lines.push(
      `* Tone: pot ${spiceNumber(tone.potOhms)} ohm ${tone.taper} taper at ${tone.setting} (${spiceNumber(tone.resistanceOhms)} ohm) in series with ${spiceNumber(tone.capacitorF)} F, hot to ground.`,
    );
    if (tone.resistanceOhms > 0) {
      lines.push(`Rtone ${HOT_NODE} tone ${spiceNumber(tone.resistanceOhms)}`, `Ctone tone ${SPICE_GROUND} ${spiceNumber(tone.capacitorF)}`);
    } else {
      lines.push(`Ctone ${HOT_NODE} ${SPICE_GROUND} ${spiceNumber(tone.capacitorF)} ; tone at 0: the capacitor alone`);
    }
  } else {
    lines.push('* No tone control.');
  }
  if (trebleBleed) {
    const resistor = trebleBleed.resistorOhms;
    lines.push(`* Treble bleed across the volume pot (hot to out): ${spiceNumber(trebleBleed.capacitorF)} F${resistor ? ` with ${spiceNumber(resistor)} ohm in ${trebleBleed.arrangement}` : ''}.`);
    if (trebleBleed.arrangement === 'series' && resistor !== undefined) {
      lines.push(`Rbleed ${HOT_NODE} bleed ${spiceNumber(resistor)}`, `Cbleed bleed ${OUTPUT_NODE} ${spiceNumber(trebleBleed.capacitorF)}`);
    } else {
      lines.push(`Cbleed ${HOT_NODE} ${OUTPUT_NODE} ${spiceNumber(trebleBleed.capacitorF)}`);
      if (resistor !== undefined) lines.push(`Rbleed ${HOT_NODE} ${OUTPUT_NODE} ${spiceNumber(resistor)}`);
    }
  }
  lines.push(
    '* Cable and amplifier input, from the output to ground.',
    `Ccable ${OUTPUT_NODE} ${SPICE_GROUND} ${spiceNumber(load.cableCapacitanceF)}`,
    `Ramp ${OUTPUT_NODE} ${SPICE_GROUND} ${spiceNumber(load.ampResistanceOhms)}`,
  );
  if (load.ampCapacitanceF > 0) lines.push(`Camp ${OUTPUT_NODE} ${SPICE_GROUND} ${spiceNumber(load.ampCapacitanceF)}`);
  lines.push(
    '',
    '.options nopage',
    `.ac dec ${settings.pointsPerDecade} ${spiceNumber(settings.startHz)} ${spiceNumber(settings.stopHz)}`,
    // With the volume at 0 the output is exactly 0 and dB would be −∞: print the magnitude instead.
    load.silent ? `.print ac vm(${OUTPUT_NODE}) vp(${OUTPUT_NODE})*180/pi` : `.print ac vdb(${OUTPUT_NODE}) vp(${OUTPUT_NODE})*180/pi`,
    '.end',
    '',
  );
  return lines.join('\n');
}
