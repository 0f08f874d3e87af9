import { describe, expect, it } from 'vitest';
import { caseSchema } from '../../src/knowledge/case-schema.js';
import { analyseTests } from '../../src/engine/series-analyses.js';
import { formatSeries } from '../../src/report/series-text.js';
import { blockChart } from '../../src/chart/series-chart.js';

describe('series charts for the terminal', () => {
  it('draws one block per reading with the suspect marked under it', () => {
    expect(blockChart({ values: [1, 1, 1, 3, 1, 1], reference: 1, marks: [{ at: 3, label: '4–5 open' }] }).join('\n')).toMatchInlineSnapshot(`
      "1 ▅▅▅█▅▅
           ▲  4–5 open"
    `);
  });

  it('wraps a long series in rows numbered by their first reading', () => {
    const lines = blockChart({ values: Array.from({ length: 25 }, () => 1), reference: 1, marks: [{ at: 21, label: 'x' }] }, 10);
    expect(lines.map((l) => l.slice(0, 3))).toEqual([' 1 ', '11 ', '21 ', '   ']);
    expect(lines[3]).toBe('    ▲  x');
  });

  it('shows each series of a job with what it found', () => {
    const job = caseSchema.parse({
      format: 'dc-case/1',
      machine: { connection: 'shunt' },
      tests: { poleDrop: { supply: 'dc', winding: 'shunt-field', values: [55, 55.2, 41, 54.8] } },
    });
    const text = formatSeries(job.tests, analyseTests(job))!;
    expect(text).toContain('Pole drop (shunt-field, DC)');
    expect(text).toMatch(/coil 3 █+ +41 V {2}▲ shorted-turns \(-25 %\)/);
    expect(text).toContain('DC test');
  });
});
