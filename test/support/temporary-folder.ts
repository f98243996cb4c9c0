/** Temporary folders for tests, removed when the test file ends (no leaks in the system's temp folder). */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, onTestFinished } from 'vitest';

/** A fresh folder under the system's temp folder, removed after all tests of the calling file. */
export function temporaryFolder(prefix: string): string {
  const folder = mkdtempSync(join(tmpdir(), `coilbench-${prefix}-`));
  afterAll(() => rmSync(folder, { recursive: true, force: true }));
  return folder;
}

/** The same for use inside a test body: removed when that test finishes. */
export function testFolder(prefix: string): string {
  const folder = mkdtempSync(join(tmpdir(), `coilbench-${prefix}-`));
  onTestFinished(() => rmSync(folder, { recursive: true, force: true }));
  return folder;
}
