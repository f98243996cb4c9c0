/**
 * What a finished output file was, as the manifest records it: its size and
 * SHA-256. A re-run keeps a file only if both still match, so a file cut
 * short, overwritten or edited by hand is made again.
 */
import { createHash } from 'node:crypto';
import { readFileSync, statSync } from 'node:fs';

export interface FileRecord {
  readonly size: number;
  readonly sha256: string;
}

/** The record of bytes about to be written. */
export function recordOf(bytes: Uint8Array | string): FileRecord {
  const data = typeof bytes === 'string' ? Buffer.from(bytes, 'utf8') : bytes;
  return { size: data.byteLength, sha256: createHash('sha256').update(data).digest('hex') };
}

/** Does the file at `path` still match `record`? (Missing file or record: no. The size is compared first, so most damage costs no hashing.) */
export function fileMatches(path: string, record: FileRecord | undefined): boolean {
  if (record === undefined) return false;
  try {
    if (statSync(path).size !== record.size) return false;
    return createHash('sha256').update(readFileSync(path)).digest('hex') === record.sha256;
  } catch {
    return false;
  }
}
