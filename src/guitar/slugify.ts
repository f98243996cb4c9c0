/** Longest slug kept for folder and file names. */
const MAX_SLUG_LENGTH = 60;

/**
 * A folder- and file-safe name from free text: lower case ASCII letters and
 * digits joined by single hyphens ("Demo three-coil guitar" → "demo-three-coil-guitar").
 */
export function slugify(text: string, fallback = 'guitar', maxLength: number = MAX_SLUG_LENGTH): string {
  const slug = text
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/gu, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/gu, '-')
    .replace(/^-+|-+$/gu, '')
    .slice(0, maxLength)
    .replace(/-+$/u, '');
  return slug === '' ? fallback : slug;
}
