/**
 * The plan as a drawing (SVG), a pure function of the plan: every pole as a
 * row of lugs (its common, then contact lugs 1…K), each lug labelled with
 * the net soldered to it, a table of which lugs each position closes, and a
 * key saying what each net joins. Text is escaped; nothing is fetched.
 */
import type { Guitar } from '../guitar/index.js';
import { describePlan } from './describe-plan.js';
import { enumerateKitPoles, poleLetter } from './switch-kit.js';
import type { SwitchPlan } from './solve-switch-plan.js';
import { maxOf } from '../math/index.js';

/** Layout of the drawing, in SVG user units (our choice, sized for a printed page). */
const ROW_HEIGHT = 46;
const LUG_SPACING = 70;
const LUG_RADIUS = 9;
const LEFT = 150;
const TOP = 40;
const KEY_LINE = 18;
const FONT_SIZE = 12;
const POSITION_CELL = 26;

export function escapeXml(text: string): string {
  return text.replace(/&/gu, '&amp;').replace(/</gu, '&lt;').replace(/>/gu, '&gt;').replace(/"/gu, '&quot;').replace(/'/gu, '&#39;');
}

/** The drawing of `plan` for `guitar`, as one SVG document. */
export function renderSwitchDrawing(guitar: Guitar, plan: SwitchPlan): string {
  const description = describePlan(guitar, plan);
  const tagOf = new Map(description.nets.map((net) => [net.net, net.tag]));
  const poles = enumerateKitPoles(plan.kit);
  const maxContacts = maxOf(plan.kit.switches.map((definition) => definition.contactLugs));
  const maxPositions = maxOf(plan.kit.switches.map((definition) => definition.positions.length));
  const tableLeft = LEFT + (maxContacts + 1) * LUG_SPACING + LUG_SPACING / 2;
  const width = tableLeft + (maxPositions + 1) * POSITION_CELL + LUG_SPACING;
  const polesHeight = TOP + poles.length * ROW_HEIGHT + plan.kit.switches.length * KEY_LINE;
  const keyLines = description.nets.length + description.unconnected.length + 3;
  const height = polesHeight + keyLines * KEY_LINE + KEY_LINE;
  const parts: string[] = [];
  parts.push(
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${width} ${height}" width="${width}" height="${height}" font-family="sans-serif" font-size="${FONT_SIZE}">`,
    `<title>${escapeXml(`Switch plan for ${guitar.name}`)}</title>`,
    `<rect x="0" y="0" width="${width}" height="${height}" fill="#ffffff"/>`,
    `<text x="10" y="${TOP / 2}" font-weight="bold">${escapeXml(`Switch lugs for ${guitar.name} (lug layouts differ between makers: match this to the switch in hand)`)}</text>`,
  );
  let y = TOP;
  let lastSwitch = -1;
  poles.forEach((pole) => {
    const definition = plan.kit.switches[pole.switchIndex];
    if (definition === undefined) return;
    if (pole.switchIndex !== lastSwitch) {
      lastSwitch = pole.switchIndex;
      parts.push(`<text x="10" y="${y + KEY_LINE / 2}" font-weight="bold">${escapeXml(`Switch ${pole.switchIndex + 1}: ${definition.name}`)}</text>`);
      // Position table header: which contact lugs each position closes.
      definition.positions.forEach((_, p) => {
        parts.push(`<text x="${tableLeft + (p + 1) * POSITION_CELL}" y="${y + KEY_LINE / 2}" text-anchor="middle">${p + 1}</text>`);
      });
      parts.push(`<text x="${tableLeft}" y="${y + KEY_LINE / 2}" text-anchor="end">position</text>`);
      y += KEY_LINE;
    }
    const rowY = y + ROW_HEIGHT / 2;
    parts.push(`<text x="10" y="${rowY + FONT_SIZE / 3}">${escapeXml(`pole ${poleLetter(pole.pole)}`)}</text>`);
    const lugs = description.lugs.filter((lug) => lug.switchIndex === pole.switchIndex && lug.pole === pole.pole);
    for (const lug of lugs) {
      const x = LEFT + lug.lug * LUG_SPACING;
      const tag = lug.net >= 0 ? (tagOf.get(lug.net) ?? '') : '';
      const fill = lug.lug === 0 ? '#333333' : '#ffffff';
      parts.push(
        `<circle cx="${x}" cy="${rowY}" r="${LUG_RADIUS}" fill="${fill}" stroke="#333333" stroke-width="2"/>`,
        `<text x="${x}" y="${rowY - LUG_RADIUS - 4}" text-anchor="middle" fill="#555555">${escapeXml(lug.lug === 0 ? 'C' : String(lug.lug))}</text>`,
        `<text x="${x}" y="${rowY + LUG_RADIUS + FONT_SIZE + 2}" text-anchor="middle" font-weight="bold">${escapeXml(tag === '' ? '–' : tag)}</text>`,
      );
    }
    // Which lugs the common closes in each position.
    definition.positions.forEach((touched, p) => {
      const text = touched.length === 0 ? '–' : touched.map((lug) => lug + 1).join('+');
      parts.push(`<text x="${tableLeft + (p + 1) * POSITION_CELL}" y="${rowY + FONT_SIZE / 3}" text-anchor="middle">${escapeXml(text)}</text>`);
    });
    y += ROW_HEIGHT;
  });
  y += KEY_LINE;
  parts.push(`<text x="10" y="${y}" font-weight="bold">Key: each tag joins these leads and lugs (C = common lug)</text>`);
  for (const net of description.nets) {
    y += KEY_LINE;
    const members = [...net.leads, ...net.lugs.map((lug) => `lug ${lug.label}`)].join(' + ');
    parts.push(`<text x="10" y="${y}"><tspan font-weight="bold">${escapeXml(net.tag)}</tspan>: ${escapeXml(members)}</text>`);
  }
  for (const lead of description.unconnected) {
    y += KEY_LINE;
    parts.push(`<text x="10" y="${y}">${escapeXml(`${lead}: not connected (insulate the end)`)}</text>`);
  }
  parts.push('</svg>', '');
  return parts.join('\n');
}
