/** Nothing in a rule, case or question file can run code, and nothing in src evaluates text as code. */
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { ROOT } from './support/cli.js';

function files(dir: string, ext: RegExp): string[] {
  return readdirSync(dir).flatMap((name) => {
    const p = join(dir, name);
    return statSync(p).isDirectory() ? files(p, ext) : ext.test(name) ? [p] : [];
  });
}

describe('no code from data', () => {
  it('src has no eval, no Function constructor, no mathjs evaluate or parse, and no import() of a path that is not a literal', () => {
    const offenders: string[] = [];
    for (const f of files(join(ROOT, 'src'), /\.tsx?$/)) {
      readFileSync(f, 'utf8').split('\n').forEach((line, k) => {
        // json-rules-engine's Operator#evaluate compares a fact's value with a condition's value (the
        // rule screen in src/engine/run-rules.ts calls it); it runs no text. Only that receiver is let through.
        const code = line.replace(/\/\/.*$/, '').replace(/\.operator\.evaluate\(/g, '.operator.judge(');
        if (/\beval\s*\(|\bnew\s+Function\s*\(|\bFunction\s*\(|\.evaluate\s*\(|math\.parse\s*\(|\bcompile\s*\(/.test(code)) offenders.push(`${f}:${k + 1}: ${line.trim()}`);
        const dynamic = /\bimport\s*\(\s*([^)]*)\)/.exec(code);
        if (dynamic && !/^['"][@\w./-]+['"]$/.test(dynamic[1]!.trim())) offenders.push(`${f}:${k + 1}: ${line.trim()}`);
      });
    }
    expect(offenders).toEqual([]);
  });

  it('compiles no code but its own bundle: node:vm is used in the launcher alone, on a path fixed beside it', () => {
    const users = files(join(ROOT, 'src'), /\.tsx?$/).filter((f) => /from ['"](node:)?vm['"]/.test(readFileSync(f, 'utf8')));
    expect(users.map((f) => f.slice(ROOT.length))).toEqual(['src/launch/compiled-bundle.ts']);
    const bin = readFileSync(join(ROOT, 'src', 'bin.ts'), 'utf8');
    expect(bin).toContain("runBundle(here('./core.cjs'), here('./core.cjs.cache'))");
  });

  it('the data folders hold plain JSON with no script-like strings', () => {
    const offenders: string[] = [];
    for (const dir of ['rules', 'cases']) {
      for (const f of files(join(ROOT, dir), /\.json$/)) {
        const text = readFileSync(f, 'utf8');
        if (/function\s*\(|=>|<script|\beval\b|require\(|import\(/.test(text)) offenders.push(f);
        expect(() => JSON.parse(text), f).not.toThrow();
      }
    }
    expect(offenders).toEqual([]);
  });
});
