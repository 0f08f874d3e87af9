import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { runCli } from '../support/cli.js';

const demo = 'cases/2026-10-14-press-feed-field-weak.json';

function caseFile(body: unknown): string {
  const dir = mkdtempSync(join(tmpdir(), 'dctriage-expect-'));
  const file = join(dir, 'case.json');
  writeFileSync(file, typeof body === 'string' ? body : JSON.stringify(body));
  return file;
}

describe('dctriage expect', () => {
  it('prints expected against measured as a table', () => {
    const r = runCli(['expect', demo]);
    expect(r.code).toBe(0);
    // Measured first, then what a healthy machine would read.
    expect(r.stdout).toMatch(/^speed\s+2010 rpm\s+\d+ rpm\s+\d+ %\s+!/m);
    expect(r.stdout).toContain('field current');
    expect(r.stderr).toBe('');
  });

  it('prints the quantities map as JSON with measured and ratio', () => {
    const r = runCli(['expect', demo, '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.stdout);
    expect(j.quantities.speed).toMatchObject({ unit: 'rpm', measured: 2010, basis: 'computed' });
    expect(j.quantities.speed.ratio).toBeCloseTo(2010 / j.quantities.speed.value, 4);
    expect(j.quantities.ratedTorque.measured).toBeNull();
    expect(Array.isArray(j.missing)).toBe(true);
  });

  it('names the file, the field and the value of a wrong-dimension reading, exit 2, nothing on stdout', () => {
    const file = caseFile({ format: 'dc-case/1', machine: { connection: 'shunt' }, readings: { armatureVoltage: '5 A' } });
    const r = runCli(['expect', file]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain(file);
    expect(r.stderr).toContain('readings.armatureVoltage');
    expect(r.stderr).toContain('"5 A" is not a voltage');
    expect(r.stderr).not.toMatch(/at .*\.m?js:\d+/);
  });

  it('names an unknown field', () => {
    const r = runCli(['expect', caseFile({ format: 'dc-case/1', machine: { connection: 'shunt', colour: 'grey' } })]);
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/machine: unknown field "colour"/);
  });

  it('says a file that is not JSON is not JSON', () => {
    const r = runCli(['expect', caseFile('{"format": "dc-case/1",')]);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('not valid JSON');
  });
});

describe('dctriage --help and --version', () => {
  it('shows usage with the safety notice', () => {
    const r = runCli(['--help']);
    expect(r.code).toBe(0);
    expect(r.stdout).toContain('dctriage expect FILE');
    expect(r.stdout).toMatch(/isolate, lock off and prove dead/);
  });
  it('prints the package version', async () => {
    const { default: pkg } = await import('../../package.json', { with: { type: 'json' } });
    expect(runCli(['--version']).stdout.trim()).toBe(pkg.version);
  });
  it('refuses an unknown command with exit 2', () => {
    const r = runCli(['frobnicate']);
    expect(r.code).toBe(2);
    expect(r.stderr).toContain('unknown command "frobnicate"');
  });
});
