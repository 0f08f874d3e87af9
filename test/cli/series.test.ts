import { describe, expect, it } from 'vitest';
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { runCli } from '../support/cli.js';

const job = (tests: unknown) => {
  const dir = mkdtempSync(join(tmpdir(), 'dctriage-series-'));
  const file = join(dir, 'job.json');
  writeFileSync(file, JSON.stringify({ format: 'dc-case/1', machine: { connection: 'shunt', nameplate: { armatureVoltage: '220 V', armatureCurrent: '48 A' } }, symptoms: ['sparking'], tests }));
  return file;
};
const open = Array.from({ length: 24 }, (_, i) => (i === 6 ? '40 mV' : '1.9 mV'));

describe('series on the command line', () => {
  it('diagnose --json and expect --json carry the analyses', () => {
    const file = job({ barToBar: { method: 'voltage-drop', unit: 'mV', winding: 'lap', values: open } });
    const d = runCli(['diagnose', file, '--json']);
    expect(d.code).toBe(0);
    expect(JSON.parse(d.stdout).analyses.barToBar.suspects).toEqual([{ bars: [7, 8], kind: 'open', deviation: expect.any(Number), confidence: 'high' }]);
    const e = runCli(['expect', file, '--json']);
    expect(JSON.parse(e.stdout).analyses.barToBar.pattern).toContain('open between bars 7 and 8');
  });

  it('refuses a bad series with exit 2, naming the file, the field and the position', () => {
    const file = job({ barToBar: { method: 'resistance', unit: 'mohm', winding: 'lap', values: [1.2, 1.2, '-1 mohm'] } });
    const r = runCli(['diagnose', file]);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe('');
    expect(r.stderr).toContain(file);
    expect(r.stderr).toContain('tests.barToBar.values[2]');
    expect(r.stderr).not.toMatch(/at .*\.js:\d+/);
  });
});
