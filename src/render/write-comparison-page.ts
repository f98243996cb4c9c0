/**
 * Writes the comparison page of `compare --render`: the comparison report and
 * each set's coil signals for the rendered phrase (the page sounds every
 * set's wirings from them), with the bundled comparison script.
 */
import { type ComparisonReport, renderComparisonPage } from '../report/index.js';
import { readPageScript } from './page-script.js';
import { type PageSettings, renderPageSound } from './write-listening-page.js';
import { writeFileAtomic } from './write-file-atomic.js';

/** Write the page at `path`: `sets` in `report.sets` order, each with the chain its files went through. */
export async function writeComparisonPage(path: string, report: ComparisonReport, sets: ReadonlyArray<PageSettings & { readonly chain: string }>): Promise<void> {
  const sounds = sets.map((settings) => renderPageSound(settings, settings.chain));
  await writeFileAtomic(path, renderComparisonPage(report, sounds, readPageScript('comparison')));
}
