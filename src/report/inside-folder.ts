/**
 * A path the listening page may link or load: relative and inside the page's
 * own folder (no URL scheme, no leading slash or backslash, no ".." segment).
 */
export function isInsideFolder(path: string | null | undefined): path is string {
  if (typeof path !== 'string' || path === '') return false;
  if (/^[a-zA-Z][a-zA-Z0-9+.-]*:/u.test(path) || /^[/\\]/u.test(path)) return false;
  return path.split(/[/\\]/u).every((segment) => segment !== '..');
}
