import { EventEmitter } from 'node:events';
import { describe, expect, it } from 'vitest';
import { render } from 'ink';
import { buildFlow } from '../../src/dialogue/flow.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import { Dialogue } from '../../src/ui/Dialogue.js';
import { builtInRules } from '../support/rules.js';
import { FakeStdout, settle } from '../support/dialogue.js';

class FakeStdin extends EventEmitter {
  isTTY = true;
  setRawMode() {}
  setEncoding() {}
  ref() {}
  unref() {}
  read() {
    return null;
  }
}

describe('the dialogue at 60 columns', () => {
  it('keeps every line within the width', async () => {
    const base = builtInRules();
    const stdout = new FakeStdout(60);
    const app = render(<Dialogue ctx={{ flow: buildFlow(base) }} engine={buildEngine(base)} safetyNotice={base.safety.notice} color={false} />, {
      stdout: stdout as unknown as NodeJS.WriteStream,
      stdin: new FakeStdin() as unknown as NodeJS.ReadStream,
      patchConsole: false,
      exitOnCtrlC: false,
    });
    await settle(50);
    app.unmount();
    // eslint-disable-next-line no-control-regex
    const lines = stdout.written.replace(/\u001b\[[0-9;?]*[A-Za-z]/g, '').split('\n');
    expect(lines.join(' ')).toContain('Press Enter to begin');
    expect(lines.some((l) => l.includes('Isolate,'))).toBe(true);
    for (const l of lines) expect(l.length, l).toBeLessThanOrEqual(60);
  });
});
