/** Rendering the dialogue in tests and typing into it. */
import { EventEmitter } from 'node:events';
import { render } from 'ink-testing-library';
import { buildFlow } from '../../src/dialogue/flow.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import type { Answer } from '../../src/dialogue/job.js';
import type { WorkEntry, WorkRules } from '../../src/dialogue/work.js';
import type { SavedProgress } from '../../src/dialogue/reducer.js';
import { Dialogue } from '../../src/ui/Dialogue.js';
import { builtInRules } from './rules.js';

export const settle = (ms = 25) => new Promise((r) => setTimeout(r, ms));

/** A terminal's stdout of a chosen width for Ink's own render (ink-testing-library fixes its width at 100); it keeps what is written. */
export class FakeStdout extends EventEmitter {
  rows = 24;
  isTTY = true;
  written = '';
  constructor(public columns = 80) {
    super();
  }
  write = (chunk: string) => {
    this.written += chunk;
    return true;
  };
}

export function renderDialogue(opts: { initialAnswers?: Answer[]; initialWork?: WorkEntry[]; initialProgress?: SavedProgress; machineFile?: unknown; work?: WorkRules } = {}) {
  const base = builtInRules();
  const flow = buildFlow(base);
  const saved: Answer[][] = [];
  /** Everything each save held: the answers, the checks worked and the prompts open. */
  const sessions: { answers: Answer[]; work: WorkEntry[]; progress: SavedProgress }[] = [];
  const recorded: { answers: Answer[]; outcome: Answer[] }[] = [];
  const app = render(
    <Dialogue
      ctx={{ flow, machineFile: opts.machineFile, ...(opts.work ? { work: opts.work } : {}) }}
      engine={buildEngine(base)}
      safetyNotice={base.safety.notice}
      initialAnswers={opts.initialAnswers ?? []}
      {...(opts.initialWork ? { initialWork: opts.initialWork } : {})}
      {...(opts.initialProgress ? { initialProgress: opts.initialProgress } : {})}
      onAnswers={(answers, work, progress) => {
        saved.push(answers);
        sessions.push({ answers, work, progress });
      }}
      onRecord={(answers, outcome) => {
        recorded.push({ answers, outcome });
        return 'Recorded the job as test-case.json';
      }}
      color={false}
    />,
  );
  /**
   * Waits until the dialogue has drawn a frame after `since` frames and has done what that
   * frame set off: React runs its effects (saving, diagnosing) on the next turns of the event
   * loop, and a diagnosis is promise work only. So this waits on turns of the loop, not on a
   * clock, and no test depends on the machine's speed.
   */
  const settled = async (since: number) => {
    const deadline = Date.now() + 20000;
    while (Date.now() < deadline) {
      await settle(5);
      if (app.frames.length <= since) continue;
      for (let turn = 0; turn < 5; turn++) await new Promise((r) => setImmediate(r));
      if (!/Working out/.test(app.lastFrame() ?? '')) return;
    }
    throw new Error(`the dialogue did not settle; its last frame:\n${app.lastFrame()}`);
  };
  /** Types a line and presses Enter, then waits for the dialogue (and its diagnosis) to settle. */
  const type = async (line: string) => {
    await settled(0);
    if (line !== '') {
      // The typed text is drawn before Enter, so that frame is not taken for the answer's.
      const beforeText = app.frames.length;
      app.stdin.write(line);
      await settled(beforeText);
    }
    const before = app.frames.length;
    app.stdin.write('\r');
    await settled(before);
  };
  /** Everything printed so far: the settled transcript and the live area. */
  const screen = () => app.frames.join('\n');
  return { ...app, type, screen, saved, sessions, recorded, flow };
}
