/**
 * The listening page's note on which wirings sound alike: the summary line
 * and every group of two or more, from the report's `groups` (the
 * distinctness analysis). Escaped text only; nothing here runs script.
 */
import { escapeHtml } from './escape-html.js';
import type { ListeningReport } from './listening-report.js';

/** The "Which wirings sound alike" section, or nothing when the report has no groups. */
export function renderGroupsSection(report: ListeningReport): string {
  const groups = report.groups;
  if (!groups) return '';
  const { levelDb, spectrumDb, brightnessPercent } = groups.thresholds;
  const shared = groups.groups.filter((group) => group.members.length > 1);
  const items = shared
    .map((group) => `<li>group ${group.group}: ${group.members.map((id, index) => `${escapeHtml(id)} ${escapeHtml(group.expressions[index] ?? '')}`).join(', ')}</li>`)
    .join('');
  const list =
    shared.length > 0
      ? `<p>These sound alike (each group is a chain of alike pairs):</p><ul class="groups">${items}</ul>`
      : '<p>No two wirings sound alike at these thresholds: every wiring is its own group.</p>';
  return (
    '<section id="groups" aria-labelledby="groups-title"><h2 id="groups-title">Which wirings sound alike</h2>' +
    `<p><strong>${escapeHtml(groups.summary)}</strong>: alike means level within ${escapeHtml(String(levelDb))} dB, ` +
    `level-matched spectrum within ${escapeHtml(String(spectrumDb))} dB and brightness within ${escapeHtml(String(brightnessPercent))} % ` +
    '(just-noticeable differences, from the model of the reference strum; your ears decide).</p>' +
    list +
    '</section>'
  );
}
