/** The diagnose command's readable output: warnings first, then causes, readings, checks. */
import type { Diagnosis } from '../engine/diagnose.js';
import { formatExpectation } from './format-expect.js';
import { evidenceLines } from '../report/evidence-lines.js';
import { READING_FIELDS } from '../knowledge/case-schema.js';

const RESULT_WORDS = { normal: 'normal', abnormal: 'ABNORMAL', inconclusive: 'inconclusive' } as const;
const STATE_WORDS = { observe: 'observe (running, no contact)', 'live-test': 'LIVE TEST (qualified person)', isolated: 'isolated' } as const;

/** What a check needs of the machine and the person, in the words every list of checks uses. */
export function checkStateWords(c: Pick<Diagnosis['checks'][number], 'state' | 'running'>): string {
  return c.state === 'observe' && !c.running ? 'look (no contact, machine need not run)' : STATE_WORDS[c.state];
}

/** A warning by its severity: danger and caution read apart without colour too (the prefix), and stand out with it. */
export function warningLine(w: Diagnosis['warnings'][number], color = false): string {
  const text = w.severity === 'danger' ? `!! ${w.says}` : `!  CAUTION — ${w.says}`;
  if (!color) return text;
  // Danger: bold white on red; caution: bold yellow. Red is kept for danger alone.
  return w.severity === 'danger' ? `\x1b[1;97;41m${text}\x1b[0m` : `\x1b[1;33m${text}\x1b[0m`;
}

/** "The readings so far fit these equally well: (a) X, (b) Y or Z. The field current would tell them apart." */
function tellApartLines(d: Diagnosis, title: ReadonlyMap<string, string>): string {
  const group = (ids: string[]) => ids.map((id) => title.get(id) ?? id).join(', or ');
  const byGroups = new Map<string, string[]>();
  for (const s of d.tellApart) {
    const groups = s.between.map((h) => group(h.causes)).sort();
    const key = groups.map((g, k) => `(${String.fromCharCode(97 + k)}) ${g}`).join('; ');
    const words = Object.hasOwn(READING_FIELDS, s.reading) ? READING_FIELDS[s.reading as keyof typeof READING_FIELDS].says : s.reading;
    byGroups.set(key, [...(byGroups.get(key) ?? []), words]);
  }
  return [...byGroups].map(([groups, readings]) => `The readings so far fit these equally well: ${groups}. The ${readings.join(', or the ')} would tell them apart.`).join('\n');
}

export function formatDiagnosis(d: Diagnosis, opts: { readings?: boolean; width?: number; chart?: string | undefined; color?: boolean } = {}): string {
  const parts: string[] = [];
  if (d.warnings.length) parts.push(d.warnings.map((w) => warningLine(w, opts.color)).join('\n'));
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
  const title = new Map(d.causes.map((c) => [c.id, c.title]));
  if (d.tellApart.length) parts.push(tellApartLines(d, title));
  if (opts.readings !== false) parts.push('Readings against a healthy machine:\n' + formatExpectation(d.expectation, opts.width, { computed: false }));
  if (opts.chart) parts.push(opts.chart);
  const worked = d.checks.filter((c) => c.result);
  if (worked.length) {
    parts.push(
      'Checks worked:\n' +
        worked.map((c, k) => `${String(k + 1).padStart(2)}. ${c.title} — ${RESULT_WORDS[c.result!]}${c.finding ? `: ${c.finding}` : ''}`).join('\n'),
    );
  }
  if (d.found) {
    parts.push(
      `FOUND: ${d.found.title}. ${d.found.means}\nPut it right, then before it runs again:\n` + d.found.returnToService.map((s, k) => `  ${k + 1}. ${s}`).join('\n'),
    );
  }
  const toDo = d.checks.filter((c) => !c.result);
  if (toDo.length) {
    const lines: string[] = [];
    toDo.forEach((c, j) => {
      const k = worked.length + j;
      if (c.id === d.isolation.beforeCheck) {
        lines.push('   Before the next check, isolate:');
        d.isolation.steps.forEach((s, i) => lines.push(`     ${String.fromCharCode(97 + i)}. ${s}`));
      }
      lines.push(`${String(k + 1).padStart(2)}. ${c.title} [${checkStateWords(c)}, ~${c.minutes} min] — for: ${c.causes.map((id) => title.get(id) ?? id).join('; ')}`);
      lines.push(`      ${c.how}`);
      if (c.insteadOf) lines.push(`      (offered instead of "${d.withheld.find((w) => w.id === c.insteadOf)?.title ?? c.insteadOf}", which is not safe for this job)`);
      const hazards = c.hazardsSay.map((h) => h.split(':')[0]!.trim());
      if (hazards.length) lines.push(`      Take care: ${hazards.join('; ')}.`);
    });
    parts.push((worked.length ? 'Checks still to do, the most useful first:\n' : 'Checks, in order:\n') + lines.join('\n'));
  }
  if (d.status === 'exhausted') {
    parts.push(
      'Not found: every check worth doing is done and no cause is confirmed. Next: specialist tests (a surge comparison or growler test of the armature, the drive maker\'s diagnostics, vibration analysis), a second opinion on the findings, and keep the job as an open case (save) so the next person starts from here.',
    );
  }
  const notOffered = d.withheld.filter((w) => !w.instead);
  if (notOffered.length) parts.push('Not offered for this job:\n' + notOffered.map((w) => `  - ${w.title}: ${w.because}.`).join('\n'));
  return parts.join('\n\n');
}
