/**
 * The "which wirings really differ" summary under `analyze`'s table: how
 * many audibly distinct groups the wirings form at the thresholds, each
 * group with its members, and the closest pairs. Plain text, Markdown and
 * the `groups` record of `--json`.
 */
import type { DistinctGroups } from '../analysis/index.js';
import type { Wiring } from '../wiring/index.js';
import { describeThresholds } from './alike-options.js';

/** Closest pairs listed in the summary. */
const CLOSEST_PAIRS = 5;

const times = (distance: number | null): string => (distance === null ? 'not checked' : `${distance.toFixed(2)}×`);

/** "47 wirings, 44 audibly distinct groups at these thresholds". */
export function groupHeadline(count: number, distinct: Pick<DistinctGroups, 'groups'>): string {
  const groups = distinct.groups.groups.length;
  return `${count} wirings, ${groups} audibly distinct group${groups === 1 ? '' : 's'} at these thresholds`;
}

interface Pair {
  readonly a: number;
  readonly b: number;
  readonly distance: number;
}

/** Each wiring's nearest neighbour as pairs, closest first, each pair once. */
function closestPairs(distinct: Pick<DistinctGroups, 'groups'>, wirings: readonly Wiring[]): Pair[] {
  const seen = new Set<string>();
  const pairs: Pair[] = [];
  distinct.groups.nearest.forEach((other, index) => {
    if (other < 0) return;
    const [a, b] = (wirings[index]?.number ?? 0) < (wirings[other]?.number ?? 0) ? [index, other] : [other, index];
    const key = `${a}:${b}`;
    if (seen.has(key)) return;
    seen.add(key);
    pairs.push({ a, b, distance: distinct.groups.nearestDistance[index] as number });
  });
  return pairs.sort((x, y) => x.distance - y.distance || (wirings[x.a]?.number ?? 0) - (wirings[y.a]?.number ?? 0)).slice(0, CLOSEST_PAIRS);
}

const label = (wiring: Wiring | undefined): string => (wiring ? `${wiring.id} ${wiring.expression}` : '?');

const NOTE =
  'Distance 1.00× = just noticeable (the largest of the level, spectrum and brightness differences over its threshold). ' +
  'A group is a chain of alike pairs: its two ends can differ audibly when its largest difference is above 1×. ' +
  'Figures from the model, level matched except for the level itself: listen before you choose.';

/** The summary as plain text (or Markdown), after the table. */
export function renderGroupSummary(wirings: readonly Wiring[], distinct: DistinctGroups, markdown: boolean): string {
  const lines: string[] = [];
  const headline = `${groupHeadline(wirings.length, distinct)} (${describeThresholds(distinct.thresholds)}; ${distinct.spectra.basis.phraseName}, direct)`;
  lines.push(markdown ? `### ${headline}` : `${headline}:`);
  if (markdown) lines.push('');
  for (const group of distinct.groups.groups) {
    const members = group.members.map((member) => label(wirings[member])).join(', ');
    const size = group.members.length === 1 ? '' : ` (${group.members.length} alike, largest difference ${times(group.largestDistance)})`;
    lines.push(markdown ? `- group ${group.number}${size}: ${members}` : `  group ${group.number}${size}: ${members}`);
  }
  const pairs = closestPairs(distinct, wirings);
  if (pairs.length > 0) {
    lines.push('');
    lines.push(`Closest pairs: ${pairs.map((pair) => `${label(wirings[pair.a])} and ${label(wirings[pair.b])} (${times(pair.distance)})`).join('; ')}.`);
  }
  lines.push(NOTE);
  return `${lines.join('\n')}\n`;
}

/** The `groups` record of `analyze --json`. */
export function groupsRecord(wirings: readonly Wiring[], distinct: DistinctGroups): Record<string, unknown> {
  const { levelDb, spectrumDb, brightnessPercent } = distinct.thresholds;
  return {
    summary: groupHeadline(wirings.length, distinct),
    thresholds: { levelDb, spectrumDb, brightnessPercent },
    method: 'single linkage: connected components of the graph joining every pair with distance < 1 (independent of input order; groups can chain)',
    phrase: distinct.spectra.basis.phraseName,
    count: distinct.groups.groups.length,
    groups: distinct.groups.groups.map((group) => ({
      group: group.number,
      members: group.members.map((member) => wirings[member]?.id),
      expressions: group.members.map((member) => wirings[member]?.expression),
      largestDistance: group.largestDistance,
    })),
    closestPairs: closestPairs(distinct, wirings).map((pair) => ({
      wirings: [wirings[pair.a]?.id, wirings[pair.b]?.id],
      distance: pair.distance,
    })),
  };
}
