/** Runs the built CLI (npm test builds it first) and captures what it printed. */
import { spawnSync } from 'node:child_process';
import { cpSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url));
export const CLI = `${ROOT}dist/cli.mjs`;

export interface Run {
  code: number | null;
  stdout: string;
  stderr: string;
}

export function runCli(args: string[], opts: { cwd?: string; input?: string; env?: Record<string, string>; fileSizeLimitKiB?: number } = {}): Run {
  // A small file-size limit (ulimit -f) makes writes come up short, as on a full disk.
  const [cmd, argv] = opts.fileSizeLimitKiB === undefined ? [process.execPath, [CLI, ...args]] : ['bash', ['-c', `ulimit -f ${opts.fileSizeLimitKiB}; exec "$@"`, 'bash', process.execPath, CLI, ...args]];
  const r = spawnSync(cmd, argv, {
    cwd: opts.cwd ?? ROOT,
    input: opts.input ?? '',
    encoding: 'utf8',
    env: { ...process.env, NO_COLOR: '1', ...opts.env },
  });
  return { code: r.status, stdout: r.stdout, stderr: r.stderr };
}

/** A copy of the built install (dist, rules, cases) in a temporary folder, to break or rearrange. */
export function installCopy(): string {
  const install = mkdtempSync(join(tmpdir(), 'dctriage-install-'));
  for (const d of ['dist', 'rules', 'cases']) cpSync(join(ROOT, d), join(install, d), { recursive: true });
  return install;
}
