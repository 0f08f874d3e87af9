/** The troubleshooting loop in words: what a check's result changed, the next check, or what was found. */
import type { Diagnosis } from '../engine/diagnose.js';
import { checkStateWords } from './format-diagnosis.js';

/** Causes that rose or fell by at least this much are named. */
const CHANGE_SHOWN = 0.05;

export function formatLoopUpdate(previous: Diagnosis, now: Diagnosis, checkId: string): string {
  const worked = now.checks.find((c) => c.id === checkId);
  const lines = [`After "${worked?.title ?? checkId}" (${worked?.result ?? 'done'}):`];
  const before = new Map(previous.causes.map((c) => [c.id, c.score]));
  const after = new Map(now.causes.map((c) => [c.id, c]));
  const titles = new Map([...previous.causes, ...now.causes].map((c) => [c.id, c.title]));
  const changed = [...new Set([...before.keys(), ...after.keys()])]
    .map((id) => ({ id, from: before.get(id) ?? 0, to: after.get(id)?.score ?? 0 }))
    .filter((c) => Math.abs(c.to - c.from) >= CHANGE_SHOWN)
    .sort((a, b) => Math.abs(b.to - b.from) - Math.abs(a.to - a.from))
    .slice(0, 5);
  for (const c of changed) {
    // What the check's readings made the rules say, else the result's own weight.
    const said = new Set(previous.causes.find((x) => x.id === c.id)?.evidence.map((e) => e.says) ?? []);
    const fromReadings = after.get(c.id)?.evidence.find((e) => !e.rule.startsWith('check:') && !said.has(e.says))?.says;
    const fromResult = now.effects.filter((e) => e.check === checkId).flatMap((e) => e.effects).find((e) => e.cause === c.id)?.says;
    const why = [fromReadings, fromResult].filter(Boolean).join('; ');
    lines.push(`  ${c.to > c.from ? '↑ rises' : '↓ falls'}: ${titles.get(c.id)} ${c.from.toFixed(2)} → ${c.to > 0 ? c.to.toFixed(2) : 'out of the running'}${why ? ` — ${why}` : ''}`);
  }
  if (changed.length === 0) lines.push('  The ranking did not move.');
  lines.push(formatNext(now));
  return lines.join('\n');
}

/** What to do now: the fault found and the way back to service, the next check, or where to go when nothing is left. */
export function formatNext(d: Diagnosis): string {
  if (d.found) {
    return [
      `FOUND: ${d.found.title}. ${d.found.means}`,
      'Put it right, then before it runs again:',
      ...d.found.returnToService.map((s, k) => `  ${k + 1}. ${s}`),
      'Type record to file the job with this cause, report for the job report.',
    ].join('\n');
  }
  if (d.status === 'exhausted' || !d.next) {
    return "Not found: every check worth doing is done and no cause is confirmed. Next: specialist tests (a surge comparison or growler test of the armature, the drive maker's diagnostics, vibration analysis), a second opinion, and save the job as an open case so the next person starts from here.";
  }
  const n = d.checks.findIndex((c) => c.id === d.next);
  const c = d.checks[n]!;
  const lines = [`Next: check ${n + 1}, ${c.title} [${checkStateWords(c)}, ~${c.minutes} min]. ${c.how}`];
  if (d.isolation.beforeCheck === c.id) lines.push('Isolate first:', ...d.isolation.steps.map((s, k) => `  ${k + 1}. ${s}`));
  lines.push(`Type start ${n + 1} when you begin it, done ${n + 1} when it is finished.`);
  return lines.join('\n');
}
