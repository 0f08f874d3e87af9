import { readdirSync, readFileSync, writeFileSync } from 'node:fs';
import { spawnSync } from 'node:child_process';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { isDeepStrictEqual } from 'node:util';
import { describe, expect, it } from 'vitest';
import { loadCase } from '../../src/knowledge/load-case.js';
import { loadRuleBase, sealRuleFolder } from '../../src/knowledge/load-rules.js';
import { readRuleSeal, sealKey, sealToJson, type RuleSeal } from '../../src/knowledge/rule-seal.js';
import { diagnose } from '../../src/engine/diagnose.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import { CASES_DIR, copyOfRules, RULES_DIR } from '../support/rules.js';
import { installCopy, ROOT, runCli } from '../support/cli.js';

function builtInSeal(): RuleSeal {
  const keys = sealRuleFolder(RULES_DIR);
  if (!keys.ok) throw new Error(JSON.stringify(keys.issues));
  return new Set(keys.value);
}

/** A copy of the built-in rules with one rule's weight out of range in field.json. */
function copyWithAnEditedRule(): { dir: string; file: string } {
  const dir = copyOfRules();
  const file = join(dir, 'field.json');
  const doc = JSON.parse(readFileSync(file, 'utf8'));
  doc.rules[0].weight = 7;
  writeFileSync(file, JSON.stringify(doc, null, 2));
  return { dir, file };
}

describe('the rule seal', () => {
  it('covers every built-in rule file: no schema changes a valid file as it parses it', () => {
    const files = readdirSync(RULES_DIR).filter((f) => f.endsWith('.json'));
    expect(builtInSeal().size).toBe(files.length);
  });

  it('is what the build wrote beside the bundle', () => {
    expect(readRuleSeal(join(ROOT, 'dist', 'rules.seal.json'))).toEqual(builtInSeal());
  });

  it('loads the same rule base as full validation', () => {
    const sealed = loadRuleBase(RULES_DIR, { seal: builtInSeal() });
    const full = loadRuleBase(RULES_DIR);
    expect(sealed.ok && full.ok).toBe(true);
    expect(isDeepStrictEqual(sealed, full)).toBe(true);
  });

  it('gives every recorded case the same diagnosis as full validation', async () => {
    const sealed = loadRuleBase(RULES_DIR, { seal: builtInSeal() });
    const full = loadRuleBase(RULES_DIR);
    if (!sealed.ok || !full.ok) throw new Error('rule base does not load');
    const [a, b] = [buildEngine(sealed.value), buildEngine(full.value)];
    const files = readdirSync(CASES_DIR).filter((f) => f.endsWith('.json'));
    for (const f of files) {
      const c = loadCase(join(CASES_DIR, f));
      if (!c.ok) throw new Error(f);
      expect(JSON.stringify(await diagnose(c.value, sealed.value, a)), f).toBe(JSON.stringify(await diagnose(c.value, full.value, b)));
    }
    expect(files.length).toBeGreaterThan(40);
  });

  it('does not vouch for a file once it is edited: the edit is validated in full', () => {
    const { dir, file } = copyWithAnEditedRule();
    const loaded = loadRuleBase(dir, { seal: builtInSeal() });
    expect(loaded.ok).toBe(false);
    if (!loaded.ok) expect(loaded.issues.map((i) => `${i.file} ${i.path}`)).toEqual([`${file} rules[0].weight`]);
  });

  it('vouches for contents under the schema they passed, not under another file name', () => {
    const dir = copyOfRules();
      // A valid rule file saved as the cause catalogue is still refused.
    writeFileSync(join(dir, 'causes.json'), readFileSync(join(dir, 'field.json')));
    const loaded = loadRuleBase(dir, { seal: builtInSeal() });
    expect(loaded.ok).toBe(false);
    if (!loaded.ok) expect(loaded.issues.some((i) => i.file === join(dir, 'causes.json'))).toBe(true);
  });

  it('is ignored when missing or malformed, so every file is validated', () => {
    const dir = copyOfRules();
      expect(readRuleSeal(join(dir, 'no-such.seal.json'))).toBeUndefined();
    for (const text of ['not json', '{"format":"dctriage-rule-seal/1","passed":["x"]}', '{"format":"other","passed":[]}']) {
      writeFileSync(join(dir, 'bad.seal'), text);
      expect(readRuleSeal(join(dir, 'bad.seal')), text).toBeUndefined();
    }
    writeFileSync(join(dir, 'good.seal'), sealToJson(builtInSeal()));
    expect(readRuleSeal(join(dir, 'good.seal'))).toEqual(builtInSeal());
  });

  it('in the built CLI, still catches an edit to a copy of the built-in rules', () => {
    const { dir, file } = copyWithAnEditedRule();
    const someCase = join(CASES_DIR, readdirSync(CASES_DIR).find((f) => f.endsWith('.json'))!);
    const r = runCli(['diagnose', someCase, '--json', '--rules', dir]);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain(`${file}: at rules[0].weight`);
    expect(r.stdout).toBe('');
  });

  it('is what the built CLI reads: a seal that vouches for a file is trusted without validating it', () => {
    // An install of our own, whose seal vouches for an out-of-range weight no schema would pass:
    // the CLI then loads it, which shows the seal beside the launcher is read and used.
    const install = installCopy();
    const file = join(install, 'rules', 'field.json');
    const doc = JSON.parse(readFileSync(file, 'utf8'));
    doc.rules[0].weight = 7;
    writeFileSync(file, JSON.stringify(doc, null, 2));
    const someCase = join(CASES_DIR, readdirSync(CASES_DIR).find((f) => f.endsWith('.json'))!);
    // From a neutral folder, so the install's own rules are the ones in use, not a checkout's.
    const run = () => spawnSync(process.execPath, [join(install, 'dist', 'cli.mjs'), 'diagnose', someCase, '--json'], { encoding: 'utf8', cwd: tmpdir(), env: { ...process.env, DCTRIAGE_KNOWLEDGE: '' } });
    expect(run().status).toBe(2);
    writeFileSync(join(install, 'dist', 'rules.seal.json'), sealToJson([...builtInSeal(), sealKey('rule-file', readFileSync(file, 'utf8'))]));
    const vouched = run();
    expect(vouched.stderr).toBe('');
    expect(vouched.status).toBe(0);
  });
});
