/** "Why this question": the leading causes it tells apart, from the compiled policy. */
import type { Diagnosis } from '../engine/diagnose.js';
import type { Flow } from './flow.js';
import type { DialogueQuestion } from './questions.js';
import { belief, informationGain } from './policy.js';

export function whyAsked(q: DialogueQuestion, flow: Flow, d: Diagnosis | undefined): string {
  if (q.opening) {
    if (q.id === 'present-state' || q.id === 'drive-fault') return 'Asked first: what the machine is doing and what the drive shows decide what is safe to ask next (after a fault trip nothing is run again to look).';
    return 'Part of the machine description: the model needs it to work out what a healthy machine would read.';
  }
  const cq = flow.policy.questions.find((c) => c.question.id === q.id);
  if (!cq || !d) return 'Asked to narrow the causes.';
  const b = belief(d, flow.policy.causeIds);
  const title = new Map(flow.base.causes.map((c) => [c.id, c.title]));
  const leaders = [...b].sort((x, y) => y[1] - x[1]).slice(0, 5);
  const label = (k: number) => {
    const a = cq.answers[k]!;
    if (q.answer.kind === 'choice') return q.answer.options.find((o) => o.value === a)?.label ?? a;
    if (q.answer.kind === 'series') return `a series showing ${a.replace(/-/g, ' ')}`;
    return a === 'out-of-band' ? 'a reading away from a healthy machine' : 'a healthy reading';
  };
  const lines = leaders.map(([id]) => {
    const l = cq.likelihood.get(id) ?? [];
    const best = l.indexOf(Math.max(...l));
    const spread = Math.max(...l) - Math.min(...l) < 0.05;
    return spread ? `  ${title.get(id)}: no answer expected more than another` : `  ${title.get(id)}: ${(l[best] ?? 0) >= 0.7 ? 'most likely' : 'more likely'} ${label(best)}`;
  });
  const bits = informationGain(cq, b);
  const how = bits >= 0.3 ? 'tells the leading causes well apart' : bits >= 0.1 ? 'tells some of the leading causes apart' : 'tells the leading causes apart only a little';
  return [`Asked because the answer ${how}:`, ...lines].join('\n');
}
