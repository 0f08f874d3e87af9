/**
 * Where a site's knowledge lives and who is working: --rules/--cases, else DCTRIAGE_KNOWLEDGE,
 * else the settings file, else rules/ and cases/ of a checkout of this project around the
 * working folder. An installed package's own folders are read, never written.
 */
import { existsSync, readFileSync } from 'node:fs';
import { homedir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import * as z from 'zod';
import { readValidated } from '../knowledge/read-json.js';
import { failed, ok, type Result } from '../knowledge/result.js';

export const settingsSchema = z.strictObject({
  /** A folder holding rules/ and cases/. */
  knowledge: z.string().min(1).optional(),
  role: z.enum(['fitter', 'apprentice', 'lead']).optional(),
  /** Site rule: apprentices may not do live tests at all. */
  apprenticesMayTestLive: z.boolean().optional(),
  /** Site rule: a supervisor may authorise an apprentice's live or isolated check remotely (off unless set). */
  remoteAuthorisationAllowed: z.boolean().optional(),
});
export type Settings = z.infer<typeof settingsSchema>;

export function settingsFile(env: NodeJS.ProcessEnv): string {
  return join(env.XDG_CONFIG_HOME || join(homedir(), '.config'), 'dctriage', 'settings.json');
}

export function readSettings(env: NodeJS.ProcessEnv): Result<Settings> {
  const file = settingsFile(env);
  return existsSync(file) ? readValidated(file, settingsSchema) : ok({});
}

export interface Knowledge {
  rules: string;
  cases: string;
  /** Where the folders came from, for messages. */
  from: 'options' | 'environment' | 'settings' | 'checkout' | 'built-in';
}

/** The checkout of this project at or above `dir`, if any. */
function checkoutAround(dir: string): string | undefined {
  for (let d = resolve(dir); ; d = dirname(d)) {
    const pkg = join(d, 'package.json');
    if (existsSync(pkg) && existsSync(join(d, 'rules')) && existsSync(join(d, '.git'))) {
      try {
        if ((JSON.parse(readFileSync(pkg, 'utf8')) as { name?: string }).name === 'dctriage') return d;
      } catch {
        // an unreadable package.json is not our checkout
      }
    }
    if (dirname(d) === d) return undefined;
  }
}

export function resolveKnowledge(
  opts: { rules?: string | undefined; cases?: string | undefined },
  env: NodeJS.ProcessEnv,
  cwd: string,
  builtIn: { rules: string; cases: string } | undefined,
): Result<Knowledge> {
  const pick = (base: string, from: Knowledge['from']): Knowledge => ({ rules: opts.rules ?? join(base, 'rules'), cases: opts.cases ?? join(base, 'cases'), from: opts.rules && opts.cases ? 'options' : from });
  if (opts.rules && opts.cases) return ok({ rules: opts.rules, cases: opts.cases, from: 'options' });
  if (env.DCTRIAGE_KNOWLEDGE) return ok(pick(env.DCTRIAGE_KNOWLEDGE, 'environment'));
  const s = readSettings(env);
  if (!s.ok) return s;
  if (s.value.knowledge) return ok(pick(s.value.knowledge, 'settings'));
  const checkout = checkoutAround(cwd);
  if (checkout) return ok(pick(checkout, 'checkout'));
  if (builtIn) return ok({ rules: opts.rules ?? builtIn.rules, cases: opts.cases ?? builtIn.cases, from: 'built-in' });
  return failed({
    code: 'unreadable',
    file: cwd,
    path: '',
    message: 'no knowledge folder to write to: give --rules DIR and --cases DIR, set DCTRIAGE_KNOWLEDGE, put "knowledge" in ' + settingsFile(env) + ', or run inside a checkout of the project',
  });
}
