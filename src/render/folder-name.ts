/**
 * A folder name for a guitar's renders, readable and distinct for names in
 * any script: the name's Latin letters and digits as a slug, with a short
 * hash of the whole name added whenever letters were lost (another script,
 * symbols) or the slug was cut, so that "Гитара", "ギター" and ".." never
 * share one folder. Never "..", "~" or an empty name.
 */
import { createHash } from 'node:crypto';
import { slugify } from '../guitar/index.js';

/** Hex digits of the SHA-256 of the name kept in a folder name (32 bits: a clash needs tens of thousands of guitars). */
const NAME_HASH_DIGITS = 8;
/** Longest slug kept before the hash (slugify's own limit). */
const SLUG_LIMIT = 60;
/** Letters and digits of any script. */
const LETTER_OR_DIGIT = /[\p{L}\p{N}]/gu;
/** Characters an ASCII slug keeps once accents are taken off. */
const LATIN_LETTER_OR_DIGIT = /[a-z0-9]/giu;

/** The folder name for a guitar called `name` ("Demo three-coil guitar" → "demo-three-coil-guitar"). */
export function guitarFolderName(name: string): string {
  const slug = slugify(name, '');
  const folded = name.normalize('NFKD').replace(/[\u0300-\u036f]/gu, '');
  const letters = (folded.match(LETTER_OR_DIGIT) ?? []).length;
  const kept = (folded.match(LATIN_LETTER_OR_DIGIT) ?? []).length;
  const cut = slug.replace(/-/gu, '').length < kept || slug.length >= SLUG_LIMIT;
  if (slug !== '' && letters === kept && !cut) return slug;
  const hash = createHash('sha256').update(name, 'utf8').digest('hex').slice(0, NAME_HASH_DIGITS);
  return slug === '' ? `guitar-${hash}` : `${slug}-${hash}`;
}
