/**
 * Switch hardware in plain trade terms: a kit is a list of switches; every
 * pole of a switch is a common lug and K contact lugs; each position of the
 * switch lists the contact lugs its commons touch (the same for every pole
 * of that switch, since the poles move together). A lever switch whose
 * wiper bridges two adjacent lugs in its in-between positions gives five
 * positions from three lugs (common practice); a rotary switch touches one
 * lug per position; a toggle or a push-pull pot is a two- or
 * three-position switch.
 *
 * The kit's positions are every combination of its switches' positions,
 * the first switch changing fastest: with a five-position lever and a
 * push-pull, positions 1–5 are the lever with the push-pull in its first
 * position, 6–10 the lever again with it in its second.
 */

/** One switch: its poles and its positions. Lugs are numbered from 0 inside the code, from 1 for people. */
export interface SwitchDefinition {
  /** A name for people ("lever-5-position-2-pole", or the file's own name). */
  readonly name: string;
  /** Poles: identical sets of a common lug and `contactLugs` contact lugs, moving together. */
  readonly poles: number;
  /** Contact lugs per pole. */
  readonly contactLugs: number;
  /** positions[p]: contact lugs (0-based, ascending) the common touches in position p; may be empty (a centre-off). */
  readonly positions: readonly (readonly number[])[];
}

export interface SwitchKit {
  readonly switches: readonly SwitchDefinition[];
}

/** A position of the kit: one position per switch. */
export interface KitPosition {
  /** 0-based number of the kit position. */
  readonly index: number;
  /** Position of each switch, 0-based, in kit order. */
  readonly switchPositions: readonly number[];
}

/** A pole of the kit, addressed by switch and pole. */
export interface KitPole {
  readonly switchIndex: number;
  readonly pole: number;
}

/** Largest kit the planner accepts: positions (common practice: a rotary switch has at most a dozen; two switches of a dozen give 144). */
export const MAX_KIT_POSITIONS = 144;

/** Number of kit positions: the product of the switches' positions. */
export function countKitPositions(kit: SwitchKit): number {
  return kit.switches.reduce((product, definition) => product * definition.positions.length, 1);
}

/** Every kit position, the first switch changing fastest. */
export function enumerateKitPositions(kit: SwitchKit): KitPosition[] {
  const total = countKitPositions(kit);
  const positions: KitPosition[] = [];
  for (let index = 0; index < total; index += 1) {
    let rest = index;
    const switchPositions = kit.switches.map((definition) => {
      const position = rest % definition.positions.length;
      rest = Math.floor(rest / definition.positions.length);
      return position;
    });
    positions.push({ index, switchPositions });
  }
  return positions;
}

/** Every pole of the kit in order: switch by switch, pole by pole. */
export function enumerateKitPoles(kit: SwitchKit): KitPole[] {
  return kit.switches.flatMap((definition, switchIndex) => Array.from({ length: definition.poles }, (_, pole) => ({ switchIndex, pole })));
}

/** Letters for poles as people read them: A, B, C, … */
export function poleLetter(pole: number): string {
  return String.fromCharCode('A'.charCodeAt(0) + pole);
}

/** "1" for a one-switch kit; "lever 1 / push-pull 2" style labels for more: the switch name and its 1-based position. */
export function describeKitPosition(kit: SwitchKit, position: KitPosition): string {
  if (kit.switches.length === 1) return String((position.switchPositions[0] ?? 0) + 1);
  return kit.switches.map((definition, k) => `${definition.name} ${(position.switchPositions[k] ?? 0) + 1}`).join(', ');
}

/** A copy of the kit with `extra` poles more on switch `switchIndex`. */
export function withMorePoles(kit: SwitchKit, switchIndex: number, extra: number): SwitchKit {
  return {
    switches: kit.switches.map((definition, k) =>
      k === switchIndex ? { ...definition, poles: definition.poles + extra, name: renamePoles(definition.name, definition.poles + extra) } : definition,
    ),
  };
}

/** A preset name follows its pole count; a written-out switch gets "(N poles)". */
function renamePoles(name: string, poles: number): string {
  const renamed = name.replace(/-\d+-pole$/u, `-${poles}-pole`);
  return renamed === name ? `${name} (${poles} poles)` : renamed;
}

/** A copy of the kit with one more switch at the end. */
export function withSwitch(kit: SwitchKit, definition: SwitchDefinition): SwitchKit {
  return { switches: [...kit.switches, definition] };
}
