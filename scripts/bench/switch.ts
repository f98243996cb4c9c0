/**
 * The switch planner: a plan for a five-position, four-pole lever and three
 * coils; `--choose` over the 47 wirings of three coils; how the exact search
 * scales with poles and positions (random lug wirings read off as wishes, so
 * a plan is known to exist). Figures and ratios to the one-pole lever's
 * standard plan, in the same process.
 */
import { performance } from 'node:perf_hooks';
import type { Guitar } from '../../src/guitar/index.js';
import { createRandom } from '../../src/math/index.js';
import { type PositionWish, measureChoiceWirings, parseSwitchTexts, solveSwitchChoice, solveSwitchPlan } from '../../src/switching/index.js';
import { enumerateWirings } from '../../src/wiring/index.js';
import { randomInterestingPlan } from '../../test/support/random-switch-plan.js';
import { sample } from './guitars.js';
import { heading, line, medianMs } from './timing.js';

/** The command's default step budget (src/cli/commands/switch.ts). */
const COMMAND_BUDGET = 2_000_000;
/** Random plans per kit: the four-pole figure, and each row of the scaling table. */
const FOUR_POLE_PLANS = 40;
const PLANS_PER_KIT = 20;

interface Figures {
  readonly count: number;
  readonly medianSteps: number;
  readonly worstSteps: number;
  readonly medianMs: number;
  readonly worstMs: number;
  readonly unsettled: number;
}

/** Plans known to exist (random lug wirings with `minWirings` different wirings read off), searched with the command's budget. */
function measureKnownPlans(guitar: Guitar, kitTexts: readonly string[], seed: number, plans: number, minWirings: number): Figures {
  const kit = parseSwitchTexts(kitTexts);
  const random = createRandom(seed);
  const steps: number[] = [];
  const times: number[] = [];
  let unsettled = 0;
  for (let k = 0; k < plans; k += 1) {
    const made = randomInterestingPlan(guitar, kit, random, minWirings);
    if (made === null) continue;
    const started = performance.now();
    const result = solveSwitchPlan(kit, guitar.elements.length, made.wishes, { stepBudget: COMMAND_BUDGET });
    times.push(performance.now() - started);
    steps.push(result.steps);
    if (result.status !== 'found') unsettled += 1;
  }
  steps.sort((a, b) => a - b);
  times.sort((a, b) => a - b);
  const middle = (list: readonly number[]): number => list[list.length >> 1] ?? 0;
  return {
    count: steps.length,
    medianSteps: middle(steps),
    worstSteps: steps[steps.length - 1] ?? 0,
    medianMs: middle(times),
    worstMs: times[times.length - 1] ?? 0,
    unsettled,
  };
}

export function benchSwitch(): void {
  heading('Switch planner (exact lug-wiring search)');
  const guitar = sample('three-single-coil.json');
  const wirings = enumerateWirings(guitar.elements);
  const wish = (text: string): PositionWish => {
    const wiring = wirings.find((candidate) => candidate.expression === text);
    if (!wiring) throw new Error(text);
    return { kind: 'wiring', network: wiring.network, expression: wiring.expression };
  };
  const standard = ['neck', 'neck // mid', 'mid', 'mid // bridge', 'bridge'].map(wish);
  const reference = medianMs(() => solveSwitchPlan(parseSwitchTexts(['lever-5-position-1-pole']), 3, standard));
  line('reference: one-pole five-position lever, the five usual positions', `${reference.toFixed(1)} ms`);

  // A five-position four-pole lever: plans known to exist, taken from random lug wirings.
  const fourPole = measureKnownPlans(guitar, ['lever-5-position-4-pole'], 5404, FOUR_POLE_PLANS, 3);
  line(
    `five-position four-pole lever, three coils: ${fourPole.count} plans (3+ different wirings each)`,
    `median ${fourPole.medianMs.toFixed(0)} ms, worst ${fourPole.worstMs.toFixed(0)} ms (${(fourPole.worstMs / reference).toFixed(1)}× reference); ${fourPole.unsettled} not settled within ${COMMAND_BUDGET} steps`,
  );
  const standardFourPole = medianMs(() => solveSwitchPlan(parseSwitchTexts(['lever-5-position-4-pole']), 3, standard));
  line('five-position four-pole lever, the five usual positions', `${standardFourPole.toFixed(1)} ms`);

  // --choose over the 47 wirings.
  const started = performance.now();
  const { list, distance } = measureChoiceWirings(guitar, wirings);
  const measured = performance.now() - started;
  for (const kitText of ['lever-5-position-1-pole', 'lever-5-position-2-pole', 'lever-5-position-4-pole']) {
    const kit = parseSwitchTexts([kitText]);
    const t0 = performance.now();
    const choice = solveSwitchChoice(kit, guitar, list, distance, { humCancelling: false, include: [], levelWindowDb: null, planSearchLimit: 40 }, { stepBudget: 5_000 });
    const ms = performance.now() - t0;
    line(
      `--choose over 47 wirings, ${kitText}`,
      `${(ms / 1000).toFixed(1)} s + ${(measured / 1000).toFixed(1)} s distinctness; ${choice.planSearches} plan searches; smallest difference ${choice.minDistance.toFixed(2)}× JND${choice.proven ? ' (proven)' : ' (best found)'}`,
    );
  }

  // Scaling with poles and positions: one row per kit.
  const humbuckers = sample('two-humbucker.json');
  console.log(`\n  scaling (${PLANS_PER_KIT} random plans known to exist per row, budget ${COMMAND_BUDGET} steps)`);
  console.log('  kit                                        coils  lugs  median steps  worst steps  median ms  worst ms  unsettled');
  const rows: [readonly string[], Guitar][] = [
    [['lever-3-position-1-pole'], guitar],
    [['lever-5-position-1-pole'], guitar],
    [['lever-5-position-2-pole'], guitar],
    [['lever-5-position-3-pole'], guitar],
    [['lever-5-position-4-pole'], guitar],
    [['rotary-6-position-1-pole'], guitar],
    [['rotary-6-position-2-pole'], guitar],
    [['rotary-6-position-3-pole'], guitar],
    [['lever-5-position-2-pole', 'push-pull-1-pole'], guitar],
    [['lever-5-position-2-pole'], humbuckers],
    [['lever-5-position-4-pole'], humbuckers],
  ];
  for (const [kitTexts, rowGuitar] of rows) {
    const figures = measureKnownPlans(rowGuitar, kitTexts, 77, PLANS_PER_KIT, 2);
    const kit = parseSwitchTexts(kitTexts);
    const lugs = kit.switches.reduce((sum, definition) => sum + definition.poles * (1 + definition.contactLugs), 0);
    console.log(
      `  ${kitTexts.join(' + ').padEnd(42)} ${String(rowGuitar.elements.length).padStart(5)} ${String(lugs).padStart(5)} ${String(figures.medianSteps).padStart(13)} ${String(figures.worstSteps).padStart(12)} ${figures.medianMs.toFixed(1).padStart(10)} ${figures.worstMs.toFixed(0).padStart(9)} ${String(figures.unsettled).padStart(10)}`,
    );
  }
}
