/**
 * A JSON document written to a file exactly as `JSON.stringify(value, null,
 * 2)` and a newline, but in chunks (report/write-json.ts) through an atomic
 * file stream (write-file-atomic.ts): a report of thousands of wirings never
 * exists as one string. report.json of a five-coil render (9,997 wirings) is
 * 38 MB of text; whole, its string, the stringifier's buffer and the UTF-8
 * copy raised the render's peak memory by about 90 MB.
 */
import { writeJson } from '../report/text/index.js';
import { openFileAtomicSync } from './write-file-atomic.js';

/** Write `value` as JSON to `path` atomically (temporary file, fsync, rename). Throws WorkError on failure, leaving no temporary file. */
export function writeJsonFileAtomicSync(path: string, value: unknown): void {
  const stream = openFileAtomicSync(path);
  try {
    writeJson(value, stream.write);
  } catch (error) {
    stream.abandon();
    throw error;
  }
  stream.commit();
}
