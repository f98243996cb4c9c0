/**
 * Plans checked by simulation: each position's circuit of lugs, contacts and
 * coil leads, solved by nodal analysis, against the wanted wiring solved by
 * the series–parallel engine (0.001 dB, 0.01°); and the same positions as
 * plain SPICE netlists through ngspice (the `eecircuit-engine` WebAssembly
 * build from the npm registry) against the wanted wiring (0.01 dB).
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { Simulation } from 'eecircuit-engine';
import { beforeAll, describe, expect, it } from 'vitest';
import { type Guitar, parseGuitarText } from '../guitar/index.js';
import { prepareCircuit, renderGraphNetlist, solveTransfers } from '../circuit/index.js';
import { createRandom } from '../math/index.js';
import { type Wiring, enumerateWirings } from '../wiring/index.js';
import { randomInterestingPlan } from '../../test/support/random-switch-plan.js';
import { runAcSweep } from '../../test/support/ngspice-sweep.js';
import {
  type PositionWish,
  VERIFY_TOLERANCE_DB,
  VERIFY_TOLERANCE_DEG,
  parseSwitchTexts,
  readPlanPositions,
  solveSwitchPlan,
  verifySwitchPlan,
} from './index.js';

const samples = join(import.meta.dirname, '..', '..', 'samples');
const read = (name: string): Guitar => parseGuitarText(readFileSync(join(samples, name), 'utf8'));
const THREE = read('three-single-coil.json');
const FOUR = read('humbucker-two-single-coil.json');
const SPICE_TOLERANCE_DB = 0.01;

function wishOf(wirings: readonly Wiring[], text: string): PositionWish {
  const wiring = wirings.find((candidate) => candidate.expression === text);
  if (!wiring) throw new Error(`no wiring ${text}`);
  return { kind: 'wiring', network: wiring.network, expression: wiring.expression };
}

function planFor(guitar: Guitar, kitText: string[], wishes: PositionWish[]) {
  const kit = parseSwitchTexts(kitText);
  const result = solveSwitchPlan(kit, guitar.elements.length, wishes);
  if (result.plan === null) throw new Error(`no plan: ${result.status}`);
  return readPlanPositions(guitar, result.plan);
}

const THREE_WIRINGS = enumerateWirings(THREE.elements);
const STANDARD = ['neck', 'neck // mid', 'mid', 'mid // bridge', 'bridge'].map((text) => wishOf(THREE_WIRINGS, text));

describe('nodal analysis of every position equals the wanted wiring', () => {
  it('three single coils on a one-pole five-position lever', () => {
    const checks = verifySwitchPlan(THREE, planFor(THREE, ['lever-5-position-1-pole'], STANDARD), STANDARD);
    expect(checks).toHaveLength(5);
    for (const check of checks) {
      expect(check.maxDb).toBeLessThan(VERIFY_TOLERANCE_DB);
      expect(check.maxDeg).toBeLessThan(VERIFY_TOLERANCE_DEG);
      expect(check.unusedRelative).toBeLessThan(1e-12);
      expect(check.passed).toBe(true);
    }
  });

  it('random plans on a two-pole toggle and a push-pull, four coils (a humbucker and two single coils)', () => {
    const kitText = ['toggle-3-position-2-pole', 'push-pull-1-pole'];
    const kit = parseSwitchTexts(kitText);
    const random = createRandom(1414);
    let checked = 0;
    for (let k = 0; k < 6; k += 1) {
      const made = randomInterestingPlan(FOUR, kit, random, 2);
      if (made === null) continue;
      const positions = readPlanPositions(FOUR, made.plan);
      const checks = verifySwitchPlan(FOUR, positions, made.wishes, { volumeSetting: 7, toneSetting: 4 });
      for (const check of checks) expect(check.passed, `plan ${k} position ${check.index + 1}`).toBe(true);
      checked += checks.length;
    }
    expect(checked).toBeGreaterThan(10);
  });

  it('can fail: the same positions checked against the wrong wirings do not pass', () => {
    const positions = planFor(THREE, ['lever-5-position-1-pole'], STANDARD);
    const shifted = [...STANDARD.slice(1), STANDARD[0] as PositionWish];
    const checks = verifySwitchPlan(THREE, positions, shifted);
    expect(checks.every((check) => !check.passed)).toBe(true);
  });
});

describe('ngspice (eecircuit-engine) runs each position\'s netlist', () => {
  let simulation: Simulation;
  beforeAll(async () => {
    simulation = new Simulation();
    await simulation.start();
  });

  it('and agrees with the wanted wiring within 0.01 dB in every position', async () => {
    const positions = planFor(THREE, ['lever-5-position-1-pole'], STANDARD);
    for (const [index, position] of positions.entries()) {
      const { frequencies, output } = await runAcSweep(simulation, renderGraphNetlist(THREE, position.circuit, `position ${index + 1}`));
      const wanted = STANDARD[index] as PositionWish & { kind: 'wiring' };
      const transfers = solveTransfers(prepareCircuit(THREE, frequencies), wanted.network);
      let worst = 0;
      frequencies.forEach((_, k) => {
        let re = 0;
        let im = 0;
        for (const transfer of transfers) {
          re += transfer[2 * k] as number;
          im += transfer[2 * k + 1] as number;
        }
        const spice = output[k] ?? { real: Number.NaN, img: Number.NaN };
        worst = Math.max(worst, Math.abs(20 * Math.log10(Math.hypot(re, im) / Math.hypot(spice.real, spice.img))));
      });
      expect(frequencies.length).toBeGreaterThan(50);
      expect(worst, `position ${index + 1}`).toBeLessThan(SPICE_TOLERANCE_DB);
    }
  });
});
