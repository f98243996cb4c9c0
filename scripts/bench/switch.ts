/**
 * The switch planner: a plan for a five-position, four-pole lever and three
 * coils; `--choose` over the 47 wirings of three coils; how the exact search
 * scales with poles and positions (random lug wirings read off as wishes, so
 * a plan is known to exist). Figures and ratios to the one-pole lever's
 * standard plan, in the same process.
 */
import { performance } from 'node:perf_hooks';
import { createRandom } from '../../src/math/index.js';
import { type PositionWish, measureChoiceWirings, parseSwitchTexts, solveSwitchChoice, solveSwitchPlan } from '../../src/switching/index.js';
import { enumerateWirings } from '../../src/wiring/index.js';
import { randomInterestingPlan } from '../../test/support/random-switch-plan.js';
import { sample } from './guitars.js';
import { heading, line, medianMs } from './timing.js';

/** Steps allowed per search in the scaling table (the CLI's default is 2 000 000). */
const SCALING_BUDGET = 300_000;
const PLANS_PER_KIT = 6;

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
  const fourPole = parseSwitchTexts(['lever-5-position-4-pole']);
  const random = createRandom(5404);
  const times: number[] = [];
  let unproven = 0;
  for (let k = 0; k < PLANS_PER_KIT; k += 1) {
    const made = randomInterestingPlan(guitar, fourPole, random, 3);
    if (made === null) continue;
    const started = performance.now();
    const result = solveSwitchPlan(fourPole, 3, made.wishes);
    times.push(performance.now() - started);
    if (result.status !== 'found') unproven += 1;
  }
  times.sort((a, b) => a - b);
  line(
    `five-position four-pole lever, three coils: ${times.length} plans (3+ different wirings each)`,
    `median ${(times[times.length >> 1] ?? 0).toFixed(0)} ms, worst ${(times[times.length - 1] ?? 0).toFixed(0)} ms (${((times[times.length >> 1] ?? 0) / reference).toFixed(1)}× reference); ${unproven} not settled within 2 000 000 steps`,
  );

  // --choose over the 47 wirings.
  const started = performance.now();
  const { list, distance } = measureChoiceWirings(guitar, wirings);
  const measured = performance.now() - started;
  for (const kitText of ['lever-5-position-1-pole', 'lever-5-position-2-pole']) {
    const kit = parseSwitchTexts([kitText]);
    const t0 = performance.now();
    const choice = solveSwitchChoice(kit, 3, list, distance, { humCancelling: false, include: [], levelWindowDb: null, planSearchLimit: 40 }, { stepBudget: 5_000 });
    const ms = performance.now() - t0;
    line(
      `--choose over 47 wirings, ${kitText}`,
      `${(ms / 1000).toFixed(1)} s + ${(measured / 1000).toFixed(1)} s distinctness; ${choice.planSearches} plan searches; smallest difference ${choice.minDistance.toFixed(2)}× JND${choice.proven ? ' (proven)' : ' (best found)'}`,
    );
  }

  // Scaling with poles and positions.
  for (const kitText of ['lever-3-position-1-pole', 'lever-5-position-1-pole', 'rotary-6-position-1-pole', 'lever-5-position-2-pole', 'lever-5-position-3-pole', 'lever-5-position-4-pole', 'rotary-6-position-2-pole']) {
    const kit = parseSwitchTexts([kitText]);
    const rng = createRandom(77);
    const steps: number[] = [];
    const ms: number[] = [];
    let open = 0;
    for (let k = 0; k < PLANS_PER_KIT; k += 1) {
      const made = randomInterestingPlan(guitar, kit, rng, 2);
      if (made === null) continue;
      const t0 = performance.now();
      const result = solveSwitchPlan(kit, 3, made.wishes, { stepBudget: SCALING_BUDGET });
      ms.push(performance.now() - t0);
      steps.push(result.steps);
      if (result.status !== 'found') open += 1;
    }
    steps.sort((a, b) => a - b);
    ms.sort((a, b) => a - b);
    line(
      `scaling: ${kitText}, ${steps.length} plans`,
      `median ${steps[steps.length >> 1] ?? 0} steps, ${(ms[ms.length >> 1] ?? 0).toFixed(0)} ms (${((ms[ms.length >> 1] ?? 0) / reference).toFixed(1)}× reference); ${open} over ${SCALING_BUDGET} steps`,
    );
  }
}
