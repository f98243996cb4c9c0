/**
 * Where a render's files go: renders/<guitar-slug>/ with index.html, wav/,
 * netlists/, report.json, wirings.csv and report.md (docs/design.md, output folder).
 */
import { join } from 'node:path';
import { slugify } from '../guitar/index.js';
import { FOLDER_MARKER } from './folder-claim.js';
import { guitarFolderName } from './folder-name.js';
import type { Wiring } from '../wiring/index.js';
import { hashOf } from './render-manifest.js';

/**
 * Longest part of a WAV name taken from the wiring's description, characters:
 * with the number, "-" and ".wav" the name stays well
 * under the 255-byte limit of common file systems (NAME_MAX).
 */
const MAX_DESCRIPTION_SLUG = 200;
/** Hex characters of the hash that ends a cut name (32 bits: a clash between two cut names of one guitar is vanishingly unlikely). */
const NAME_HASH_CHARACTERS = 8;

export interface OutputFolder {
  readonly root: string;
  readonly wavFolder: string;
  readonly netlistFolder: string;
  readonly reportJson: string;
  readonly wiringsCsv: string;
  readonly reportMarkdown: string;
  readonly page: string;
  /** Hidden file recording what each output was made from, so a re-run skips what is complete and unchanged. */
  readonly manifest: string;
  /** Hidden folder of parked audio between the two passes (removed when the run ends). */
  readonly scratch: string;
  /** Hidden file saying coilbench made this folder, for which guitar and settings (src/render/folder-claim.ts). */
  readonly marker: string;
}

/** The default folder for a guitar: renders/<folder name of the guitar> under `base` (src/render/folder-name.ts). */
export function defaultOutputRoot(base: string, guitarName: string): string {
  return join(base, 'renders', guitarFolderName(guitarName));
}

export function outputFolder(root: string): OutputFolder {
  return {
    root,
    wavFolder: join(root, 'wav'),
    netlistFolder: join(root, 'netlists'),
    reportJson: join(root, 'report.json'),
    wiringsCsv: join(root, 'wirings.csv'),
    reportMarkdown: join(root, 'report.md'),
    page: join(root, 'index.html'),
    manifest: join(root, '.coilbench-manifest.json'),
    scratch: join(root, '.scratch'),
    marker: join(root, FOLDER_MARKER),
  };
}

/**
 * File name of a wiring's render: its number and its whole description as a
 * slug ("w9-neck-and-bridge-in-series-bridge-out-of-phase.wav"), so names read
 * differently wherever descriptions do. A description too long for a file
 * name is cut and ends in a short hash of the whole description, so two cut
 * names never read alike; the full expression is in the WAV's INFO and the
 * reports.
 */
export function wavFileName(wiring: Pick<Wiring, 'id' | 'description'>): string {
  const words = slugify(wiring.description, 'wiring', Number.POSITIVE_INFINITY);
  if (words.length <= MAX_DESCRIPTION_SLUG) return `${wiring.id}-${words}.wav`;
  const cut = words.slice(0, MAX_DESCRIPTION_SLUG - NAME_HASH_CHARACTERS - 1).replace(/-+$/u, '');
  return `${wiring.id}-${cut}-${hashOf(wiring.description).slice(0, NAME_HASH_CHARACTERS)}.wav`;
}

/** File name of a wiring's SPICE netlist. */
export function netlistFileName(wiring: Pick<Wiring, 'id' | 'description'>): string {
  return wavFileName(wiring).replace(/\.wav$/u, '.cir');
}
