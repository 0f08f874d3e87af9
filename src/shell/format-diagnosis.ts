/** The diagnose command's readable output: warnings first, then causes, readings, checks. */
import type { Diagnosis } from '../engine/diagnose.js';
import { formatExpectation } from './format-expect.js';
import { evidenceLines } from '../report/evidence-lines.js';

const STATE_WORDS = { observe: 'observe (running, no contact)', 'live-test': 'LIVE TEST (qualified person)', isolated: 'isolated' } as const;

export function formatDiagnosis(d: Diagnosis, opts: { readings?: boolean; width?: number; chart?: string | undefined } = {}): string {
  const parts: string[] = [];
  if (d.warnings.length) parts.push(d.warnings.map((w) => `!! ${w.says}`).join('\n'));
  if (d.causes.length === 0) parts.push('No cause stands out from what is known. Add readings or observations and run again.');
  else {
    parts.push(
      'Likely causes:\n' +
        d.causes
          .slice(0, 6)
          .map((c, k) => `${k + 1}. ${c.title} (${c.id}) — score ${c.score.toFixed(2)}\n${evidenceLines(c.evidence).map((e) => `     ${e.supports ? '+' : '−'} ${e.says}`).join('\n')}`)
          .join('\n'),
    );
  }
  if (opts.readings !== false) parts.push('Readings against a healthy machine:\n' + formatExpectation(d.expectation, opts.width, { computed: false }));
  if (opts.chart) parts.push(opts.chart);
  if (d.checks.length) {
    const title = new Map(d.causes.map((c) => [c.id, c.title]));
    const lines: string[] = [];
    d.checks.forEach((c, k) => {
      if (c.id === d.isolation.beforeCheck) {
        lines.push('   Before the next check, isolate:');
        d.isolation.steps.forEach((s, j) => lines.push(`     ${String.fromCharCode(97 + j)}. ${s}`));
      }
      lines.push(`${String(k + 1).padStart(2)}. ${c.title} [${STATE_WORDS[c.state]}, ~${c.minutes} min] — for: ${c.causes.map((id) => title.get(id) ?? id).join('; ')}`);
      lines.push(`      ${c.how}`);
    });
    parts.push('Checks, in order:\n' + lines.join('\n'));
  }
  return parts.join('\n\n');
}
