/**
 * A player's request: these wirings on these positions of this kit. Either
 * a plan, or which positions cannot be had and the smallest change of
 * hardware that gives them all, found by the same search:
 *
 * 1. one more pole on one of the switches;
 * 2. an added two-position toggle (or push-pull) of one pole;
 * 3. two more poles on one switch;
 * 4. an added two-position toggle of two poles.
 *
 * Adding a toggle doubles the positions: wishes run on in kit order (the
 * first switch changes fastest), so the wishes after the first switch's
 * positions land on the toggle's second position.
 */
import { type SwitchDefinition, type SwitchKit, countKitPositions, withMorePoles, withSwitch } from './switch-kit.js';
import { MAX_POLES, presetSwitch } from './switch-presets.js';
import { type PositionWish, type SwitchPlanOptions, type SwitchPlanResult, solveSwitchPlan } from './solve-switch-plan.js';

/** Why a position cannot be had. */
export interface UnreachablePosition {
  /** Kit position, 0-based. */
  readonly index: number;
  /** 'alone': not even with every other position free; 'together': alone yes, but not with the others; 'unproven': the search ran out. */
  readonly why: 'alone' | 'together' | 'unproven';
}

export interface HardwareChange {
  readonly description: string;
  readonly kit: SwitchKit;
  readonly result: SwitchPlanResult;
}

export interface SwitchRequestResult {
  readonly result: SwitchPlanResult;
  /** More wishes than the kit has positions. */
  readonly tooMany: { readonly wishes: number; readonly positions: number } | null;
  readonly unreachable: readonly UnreachablePosition[];
  /** The first change that gives every wish (null when none of them does, or a plan exists). */
  readonly change: HardwareChange | null;
  /** Changes tried, in order, with their outcome. */
  readonly tried: readonly { readonly description: string; readonly status: SwitchPlanResult['status'] }[];
}

function toggle(poles: number): SwitchDefinition {
  return presetSwitch(`toggle-2-position-${poles}-pole`) as SwitchDefinition;
}

/** Candidate changes of hardware, smallest first. */
function candidateChanges(kit: SwitchKit): { description: string; kit: SwitchKit }[] {
  const changes: { description: string; kit: SwitchKit }[] = [];
  const morePoles = (extra: number): void => {
    kit.switches.forEach((definition, k) => {
      if (definition.poles + extra <= MAX_POLES) {
        changes.push({ description: `${extra === 1 ? 'one more pole' : `${extra} more poles`} on ${definition.name} (${definition.poles + extra} poles)`, kit: withMorePoles(kit, k, extra) });
      }
    });
  };
  morePoles(1);
  changes.push({ description: 'an added two-position toggle or push-pull with one pole', kit: withSwitch(kit, toggle(1)) });
  morePoles(2);
  changes.push({ description: 'an added two-position toggle or push-pull with two poles', kit: withSwitch(kit, toggle(2)) });
  return changes;
}

/** Solve a request; `options` bound each search. */
export function solveSwitchRequest(
  kit: SwitchKit,
  elementCount: number,
  wishes: readonly PositionWish[],
  options: Partial<SwitchPlanOptions> = {},
): SwitchRequestResult {
  const positions = countKitPositions(kit);
  const tooMany = wishes.length > positions ? { wishes: wishes.length, positions } : null;
  const unproven = { status: 'unknown' as const, plan: null, steps: 0, containment: null };
  const result = tooMany ? { ...unproven, status: 'impossible' as const } : solveSwitchPlan(kit, elementCount, wishes, options);
  if (result.status === 'found') return { result, tooMany, unreachable: [], change: null, tried: [] };

  const unreachable: UnreachablePosition[] = [];
  if (!tooMany) {
    wishes.forEach((wish, index) => {
      if (wish.kind === 'free') return;
      const alone = wishes.map((other, k): PositionWish => (k === index ? other : { kind: 'free' }));
      const single = solveSwitchPlan(kit, elementCount, alone, options);
      if (single.status === 'impossible') unreachable.push({ index, why: 'alone' });
      else if (single.status === 'unknown') unreachable.push({ index, why: 'unproven' });
    });
    if (unreachable.length === 0) {
      // Each alone is fine: find the first position that cannot join the ones before it.
      for (let last = 1; last < wishes.length; last += 1) {
        const prefix = wishes.map((wish, k): PositionWish => (k <= last ? wish : { kind: 'free' }));
        if (prefix[last]?.kind === 'free') continue;
        const partial = solveSwitchPlan(kit, elementCount, prefix, options);
        if (partial.status !== 'found') {
          unreachable.push({ index: last, why: partial.status === 'impossible' ? 'together' : 'unproven' });
          break;
        }
      }
    }
  }

  const tried: { description: string; status: SwitchPlanResult['status'] }[] = [];
  for (const candidate of candidateChanges(kit)) {
    if (countKitPositions(candidate.kit) < wishes.length) continue;
    const attempt = solveSwitchPlan(candidate.kit, elementCount, wishes, options);
    tried.push({ description: candidate.description, status: attempt.status });
    if (attempt.status === 'found') return { result, tooMany, unreachable, change: { ...candidate, result: attempt }, tried };
  }
  return { result, tooMany, unreachable, change: null, tried };
}
