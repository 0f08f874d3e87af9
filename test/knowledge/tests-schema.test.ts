import { describe, expect, it } from 'vitest';
import { caseSchema } from '../../src/knowledge/case-schema.js';
import { validate } from '../../src/knowledge/read-json.js';

const withTests = (tests: unknown) => ({ format: 'dc-case/1', machine: { connection: 'shunt' }, tests });
const issues = (tests: unknown) => {
  const r = validate('job.json', withTests(tests), caseSchema);
  return r.ok ? [] : r.issues.map((i) => `${i.file} ${i.path}: ${i.message}`);
};

describe('the tests block of dc-case/1', () => {
  it('reads typed quantities and bare numbers into the series\' own unit', () => {
    const r = validate('job.json', withTests({ barToBar: { method: 'voltage-drop', unit: 'mV', winding: 'lap', values: [1.9, '1,9 mV', '0.0021 V'] } }), caseSchema);
    expect(r.ok && r.value.tests?.barToBar?.values).toEqual([1.9, 1.9, 2.1]);
  });

  it('keeps negative dial readings of a runout series and converts them to its unit', () => {
    const r = validate('job.json', withTests({ runout: { unit: 'mm', values: [0, '-0.0005 in', 0.01] } }), caseSchema);
    expect(r.ok && r.value.tests?.runout?.values).toEqual([0, -0.0127, 0.01]);
  });

  it('refuses a series of one reading, naming the field', () => {
    expect(issues({ poleDrop: { supply: 'dc', winding: 'shunt-field', values: [55] } })).toEqual([
      'job.json tests.poleDrop.values: a series needs at least two coil readings; one reading says nothing against the others',
    ]);
  });

  it('refuses a negative resistance, naming the position', () => {
    expect(issues({ barToBar: { method: 'resistance', unit: 'mohm', winding: 'lap', values: [1.2, -1.1, 1.2] } })).toEqual([
      'job.json tests.barToBar.values[1]: reading 2: "-1.1 mohm" is negative; a resistance here is a magnitude',
    ]);
  });

  it('refuses a count of readings that does not match the bars', () => {
    expect(issues({ barToBar: { method: 'resistance', unit: 'mohm', winding: 'lap', bars: 4, values: [1, 1, 1] } })[0]).toContain('tests.barToBar.values: 3 readings for 4 bars');
  });

  it('refuses a wave winding that cannot exist with these bars and poles', () => {
    expect(issues({ barToBar: { method: 'resistance', unit: 'mohm', winding: 'wave', poles: 4, values: [1, 1, 1, 1] } })[0]).toContain('tests.barToBar.poles: a simplex wave winding of 4 poles cannot have 4 bars');
  });

  it('refuses a voltage unit on a resistance series', () => {
    expect(issues({ barToBar: { method: 'resistance', unit: 'mV', winding: 'lap', values: [1, 1] } })[0]).toContain('tests.barToBar.unit');
  });

  it('refuses an insulation curve whose minutes do not rise', () => {
    expect(issues({ insulation: { winding: 'armature', temperature: 25, values: [[1, 100], [1, 120]] } })).toEqual(['job.json tests.insulation.values[1][0]: minutes must rise: 1 after 1']);
  });
});
