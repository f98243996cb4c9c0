/**
 * File-system error codes (POSIX errno names as Node reports them) in words
 * a person can act on, and whether each means bad input (a path the user
 * chose that cannot be used) or a failure while working (the disk filled up).
 */

const WORDS: Readonly<Record<string, string>> = Object.freeze({
  ENOENT: 'no such file or folder',
  EISDIR: 'a folder',
  ENOTDIR: 'a path through something that is not a folder',
  ENAMETOOLONG: 'a name too long for the file system',
  EACCES: 'no permission',
  EPERM: 'an operation not permitted',
  EEXIST: 'something already there',
  ELOOP: 'too many levels of symbolic links',
  EROFS: 'a read-only file system',
  ENOSPC: 'no space left on the disk',
  EDQUOT: 'the disk quota used up',
  EMFILE: 'too many open files',
  ENFILE: 'too many open files',
  EIO: 'an input/output error',
  EFBIG: 'a file too large for the file system',
  EBUSY: 'a file or folder in use',
  ENOTEMPTY: 'a folder that is not empty',
  EXDEV: 'a move across file systems',
});

/** Codes that mean the path itself cannot be used as given: bad input (exit status 2). */
const PATH_CODES: ReadonlySet<string> = new Set(['ENOENT', 'EISDIR', 'ENOTDIR', 'ENAMETOOLONG', 'EACCES', 'EPERM', 'EEXIST', 'ELOOP', 'EROFS']);

/** A file-system error code in words ("no space left on the disk (ENOSPC)"). */
export function describeFileSystemCode(code: string | undefined): string {
  if (code === undefined) return 'an unreadable file';
  const words = WORDS[code];
  return words === undefined ? `a file-system error (${code})` : `${words} (${code})`;
}

/** Does this code mean the path given was unusable (bad input), rather than a failure while working? */
export function isPathProblem(code: string | undefined): boolean {
  return code !== undefined && PATH_CODES.has(code);
}

/** Is this value a Node file-system error (it carries an errno code)? */
export function fileSystemCodeOf(error: unknown): string | undefined {
  if (typeof error !== 'object' || error === null || !('code' in error)) return undefined;
  const code = (error as { code: unknown }).code;
  return typeof code === 'string' && /^E[A-Z]+$/u.test(code) ? code : undefined;
}
