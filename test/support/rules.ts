/** The built-in rule base and a way to diagnose a job written as a case file. */
import { cpSync, mkdtempSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { caseSchema, type CaseInput } from '../../src/knowledge/case-schema.js';
import { loadRuleBase, type RuleBase } from '../../src/knowledge/load-rules.js';
import { diagnose, type Diagnosis } from '../../src/engine/diagnose.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import { ROOT } from './cli.js';

export const RULES_DIR = join(ROOT, 'rules');
export const CASES_DIR = join(ROOT, 'cases');

export function builtInRules(): RuleBase {
  const r = loadRuleBase(RULES_DIR);
  if (!r.ok) throw new Error(JSON.stringify(r.issues, null, 2));
  return r.value;
}

/** A copy of the built-in rule folder to break or rearrange. */
export function copyOfRules(): string {
  const dir = mkdtempSync(join(tmpdir(), 'dctriage-rules-'));
  cpSync(RULES_DIR, dir, { recursive: true });
  return dir;
}

export async function diagnoseJob(job: Omit<CaseInput, 'format'>, base = builtInRules()): Promise<Diagnosis> {
  const c = caseSchema.parse({ format: 'dc-case/1', ...job });
  return diagnose(c, base, buildEngine(base));
}

export const topIds = (d: Diagnosis, n = 3) => d.causes.slice(0, n).map((c) => c.id);
