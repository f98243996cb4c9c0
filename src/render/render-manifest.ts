/**
 * Remembers what each output file was made from (a hash of every input that
 * shapes it) and the per-wiring measurements, so a re-run skips what is
 * complete and unchanged, and an interrupted run is completed by the next.
 * The manifest itself is written atomically after each finished file.
 */
import { createHash } from 'node:crypto';
import { existsSync, readFileSync } from 'node:fs';

/** Bump when the meaning of any output changes, so old files are re-rendered. */
export const MANIFEST_VERSION = 2;

/** Stable SHA-256 of a JSON-able value (object keys sorted). */
export function hashOf(value: unknown): string {
  return createHash('sha256').update(stableJson(value)).digest('hex');
}

/**
 * hashOf({ ...shared, ...own }) for many `own` objects that share the same
 * `shared` fields (a render's guitar, settings and model version): the
 * shared fields' JSON is made once, and each call assembles the same text
 * hashOf would hash, keys in order. `own` must not repeat a shared key.
 */
export function hashWithShared(shared: Record<string, unknown>): (own: Record<string, unknown>) => string {
  const sharedJson = new Map<string, string>();
  for (const [key, value] of Object.entries(shared)) if (value !== undefined) sharedJson.set(key, stableJson(value));
  return (own) => {
    const parts = new Map(sharedJson);
    for (const [key, value] of Object.entries(own)) {
      if (sharedJson.has(key)) throw new RangeError(`hashWithShared: ${key} is a shared field`);
      if (value !== undefined) parts.set(key, stableJson(value));
    }
    const keys = [...parts.keys()].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
    const text = `{${keys.map((key) => `${JSON.stringify(key)}:${parts.get(key) as string}`).join(',')}}`;
    return createHash('sha256').update(text).digest('hex');
  };
}

function stableJson(value: unknown): string {
  if (Array.isArray(value)) return `[${value.map(stableJson).join(',')}]`;
  if (value !== null && typeof value === 'object') {
    const entries = Object.entries(value as Record<string, unknown>)
      .filter(([, inner]) => inner !== undefined)
      .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
    return `{${entries.map(([key, inner]) => `${JSON.stringify(key)}:${stableJson(inner)}`).join(',')}}`;
  }
  if (typeof value === 'number' && !Number.isFinite(value)) return JSON.stringify(String(value));
  return JSON.stringify(value) ?? 'null';
}

/** The manifest file: one entry per output, in a shape the writer chooses. */
export interface Manifest<Entry> {
  readonly version: number;
  readonly entries: Record<string, Entry>;
}

/** Read a manifest; a missing, unreadable or older one counts as empty. */
export function readManifest<Entry>(path: string): Manifest<Entry> {
  const empty: Manifest<Entry> = { version: MANIFEST_VERSION, entries: {} };
  if (!existsSync(path)) return empty;
  try {
    const parsed = JSON.parse(readFileSync(path, 'utf8')) as Manifest<Entry>;
    return parsed.version === MANIFEST_VERSION && typeof parsed.entries === 'object' ? parsed : empty;
  } catch {
    return empty;
  }
}
