/**
 * Rule folders built to break the tool: each is refused (or reported by rules check) with the
 * file and the place named, before anything could loop, overflow or crash later.
 */
import { mkdirSync, mkdtempSync, readdirSync, readFileSync, renameSync, symlinkSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { loadRuleBase } from '../../src/knowledge/load-rules.js';
import { readJson } from '../../src/knowledge/read-json.js';
import { runCli } from '../support/cli.js';
import { CASES_DIR, copyOfRules } from '../support/rules.js';

type Json = Record<string, any>; // oxlint-disable-line no-explicit-any -- rule files edited in place
const edit = (dir: string, file: string, change: (j: Json) => void) => {
  const j = JSON.parse(readFileSync(join(dir, file), 'utf8')) as Json;
  change(j);
  writeFileSync(join(dir, file), JSON.stringify(j, null, 2));
};
const messages = (dir: string) => {
  const r = loadRuleBase(dir);
  return r.ok ? [] : r.issues.map((i) => `${i.file.slice(dir.length + 1)}: ${i.path}: ${i.message}`);
};
/** A rule family file whose one rule uses these conditions. */
const family = (dir: string, conditions: unknown, extra: Json = {}) =>
  writeFileSync(join(dir, 'hostile.json'), JSON.stringify({ family: 'hostile', rules: [{ name: 'hostile-rule', kind: 'derive', derive: 'hostile-fact', conditions, ...extra }] }));

describe('a rule folder that would loop or overflow', () => {
  it('refuses a shared condition that refers to itself, naming it', () => {
    const dir = copyOfRules();
    edit(dir, 'conditions.json', (j) => (j.conditions['loops'] = { not: { condition: 'loops' } }));
    expect(messages(dir)).toContain('conditions.json: conditions.loops: shared condition "loops" refers to itself');
  });

  it('refuses two shared conditions that refer to each other, naming the cycle', () => {
    const dir = copyOfRules();
    edit(dir, 'conditions.json', (j) => {
      j.conditions['ping'] = { all: [{ condition: 'pong' }] };
      j.conditions['pong'] = { any: [{ condition: 'ping' }, { fact: 'drive', operator: 'is', value: 'fixed-supply' }] };
    });
    expect(messages(dir)).toContain('conditions.json: conditions.ping: shared conditions refer to each other in a cycle: ping → pong → ping');
  });

  it('refuses a condition nested 2,000 deep, naming the file, before anything recurses into it', () => {
    const dir = copyOfRules();
    let c: Json = { fact: 'drive', operator: 'is', value: 'fixed-supply' };
    for (let k = 0; k < 2000; k++) c = { not: c };
    family(dir, c);
    expect(messages(dir).join('\n')).toMatch(/^hostile\.json: rules\[0\]\.conditions\.not\.not.*: nested more than 64 levels deep/m);
  });

  it('rules check reports the cycle as a finding, with exit 1', () => {
    const dir = copyOfRules();
    edit(dir, 'conditions.json', (j) => (j.conditions['loops'] = { not: { condition: 'loops' } }));
    const r = runCli(['rules', 'check', '--rules', dir, '--cases', CASES_DIR]);
    expect(r.code).toBe(1);
    expect(r.stderr).toContain('conditions.json: conditions.loops: shared condition "loops" refers to itself');
  });
});

describe('names every object has', () => {
  it('are not facts, observations or shared conditions', () => {
    for (const name of ['toString', 'constructor', 'hasOwnProperty', '__proto__']) {
      const dir = copyOfRules();
      family(dir, { fact: name, operator: 'is', value: 'x' });
      expect(messages(dir).join('\n')).toContain(`unknown fact "${name}"`);
    }
    const dir = copyOfRules();
    family(dir, { condition: 'constructor' });
    expect(messages(dir)).toContain('hostile.json: rules[0] (hostile-rule).conditions.condition: no shared condition "constructor" in conditions.json');
  });

  it('are refused in a says sentence', () => {
    const dir = copyOfRules();
    family(dir, { fact: 'drive', operator: 'is', value: 'fixed-supply' }, { says: 'speed {value.constructor}, answer {obs:toString}' });
    const m = messages(dir);
    expect(m).toContain('hostile.json: rules[0] (hostile-rule).says: {value.constructor} names no quantity the model computes: "constructor"');
    expect(m).toContain('hostile.json: rules[0] (hostile-rule).says: {obs:toString} names no observation: "toString"');
  });

  it('are refused as the observation of a question', () => {
    const dir = copyOfRules();
    edit(dir, 'questions.json', (j) => (j.questions[0].answer = { kind: 'choice', observation: 'toString' }));
    expect(messages(dir).join('\n')).toContain('"toString" is not an observation of dc-case/1');
  });
});

describe('rule files the loader used to pass over', () => {
  it('follows a link to a rule file, and a linked causes.json is found', () => {
    const dir = copyOfRules();
    const elsewhere = mkdtempSync(join(tmpdir(), 'dctriage-linked-'));
    for (const f of ['causes.json', 'field.json']) {
      renameSync(join(dir, f), join(elsewhere, f));
      symlinkSync(join(elsewhere, f), join(dir, f));
    }
    const r = loadRuleBase(dir);
    expect(r.ok).toBe(true);
    if (r.ok) expect(r.value.rules.some((x) => x.file.endsWith('field.json'))).toBe(true);
  });

  it('refuses a link to nothing or to a folder by name, never skips it', () => {
    const dir = copyOfRules();
    symlinkSync(join(dir, 'gone.json.target'), join(dir, 'gone.json'));
    mkdirSync(join(dir, 'a-folder'));
    symlinkSync(join(dir, 'a-folder'), join(dir, 'folder.json'));
    const m = messages(dir);
    expect(m).toContain('gone.json: : is a link to nothing (its target does not exist)');
    expect(m).toContain('folder.json: : is a link to something that is not a regular file');
  });

  it('names the unknown operator and the allowed ones, and a missing value', () => {
    const dir = copyOfRules();
    family(dir, { all: [{ fact: 'drive', operator: 'resembles', value: 'x' }, { fact: 'drive', operator: 'is' }] });
    const m = messages(dir);
    expect(m).toContain('hostile.json: rules[0].conditions.all[0].operator: "resembles": expected one of "is", "isNot", "isOneOf", "isNoneOf", "equal", "greaterThan", "greaterThanInclusive", "lessThan", "lessThanInclusive", "contains", "doesNotContain"');
    expect(m).toContain('hostile.json: rules[0].conditions.all[1].value: missing: this field is required');
    expect(m.join('\n')).not.toContain('Invalid input');
  });

  it('refuses a key given twice, naming it', () => {
    const dir = copyOfRules();
    writeFileSync(join(dir, 'hostile.json'), '{"family": "hostile", "rules": [{"name": "a", "kind": "derive", "derive": "b", "derive": "c", "conditions": {"fact": "drive", "operator": "is", "value": "fixed-supply"}}]}');
    expect(messages(dir)).toContain('hostile.json: rules[0]: the key "derive" appears twice in one object: only one can count, so the file is refused');
  });

  it('reads a file that starts with a byte-order mark', () => {
    const dir = copyOfRules();
    writeFileSync(join(dir, 'causes.json'), `\ufeff${readFileSync(join(dir, 'causes.json'), 'utf8')}`);
    expect(loadRuleBase(dir).ok).toBe(true);
    const file = join(mkdtempSync(join(tmpdir(), 'dctriage-bom-')), 'case.json');
    writeFileSync(file, `\ufeff${readFileSync(join(CASES_DIR, readdirSync(CASES_DIR)[0]!), 'utf8')}`);
    expect(readJson(file).ok).toBe(true);
  });
});

describe('a cases folder of 1,500 broken files', () => {
  it('is refused with the first 20 issues of the first 20 files and a count of the rest, no overflow', () => {
    const dir = mkdtempSync(join(tmpdir(), 'dctriage-broken-cases-'));
    const bad = JSON.stringify({ format: 'dc-case/1', machine: { connection: 'shunt' }, symptoms: Array(30).fill('smoking') });
    for (let k = 0; k < 1500; k++) writeFileSync(join(dir, `case-${String(k).padStart(4, '0')}.json`), bad);
    const r = runCli(['cases', 'check', dir]);
    expect(r.code).toBe(2);
    expect(r.stderr).not.toMatch(/RangeError|Maximum call stack|internal error/);
    const lines = r.stderr.trimEnd().split('\n');
    expect(lines).toHaveLength(20 * 21 + 1);
    expect(lines[20]).toMatch(/case-0000\.json: and 10 more issues in this file$/);
    expect(lines.at(-1)).toBe(`dctriage: ${dir}: and 1480 more case files with issues`);
  }, 120_000);
});

describe('rules draft into a folder it cannot write', () => {
  it('says the drafts folder cannot be written, and why', () => {
    const k = mkdtempSync(join(tmpdir(), 'dctriage-knowledge-'));
    const rules = copyOfRules();
    writeFileSync(join(rules, 'drafts'), 'a file where the drafts folder should be');
    const r = runCli(['rules', 'draft', '--from-case', join(CASES_DIR, '2025-07-29-resaw-brush-lead-crimp.json'), '--rules', rules, '--cases', CASES_DIR], { cwd: k });
    expect(r.code).toBe(74);
    expect(r.stderr).toMatch(/drafts: could not write the draft: a part of the path is not a folder/);
  });
});
