/**
 * vitest's global set-up: every temporary folder a test (or a CLI it runs) makes goes under one
 * folder for the run, removed at the end, so runs leave nothing behind in the system's temp.
 */
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';

export default function setup(): () => void {
  const root = mkdtempSync(join(tmpdir(), 'dctriage-test-run-'));
  process.env.TMPDIR = root;
  return () => rmSync(root, { recursive: true, force: true });
}
