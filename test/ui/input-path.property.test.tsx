/**
 * Whatever bytes reach the terminal's input (typed, pasted, a stray escape sequence), the
 * dialogue takes them or refuses them and goes on: through the real input path (Ink's own render
 * and input parser, the stdin guard, the line editor and the reducer), never an exception.
 */
import { EventEmitter } from 'node:events';
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { render } from 'ink';
import { buildFlow } from '../../src/dialogue/flow.js';
import { buildEngine } from '../../src/engine/run-rules.js';
import { Dialogue } from '../../src/ui/Dialogue.js';
import { guardedStdin, inputFilter, PASTED_LINE_BREAK } from '../../src/ui/guarded-stdin.js';
import { builtInRules } from '../support/rules.js';
import { FakeStdout, settle } from '../support/dialogue.js';

/** A terminal's stdin that hands Ink the bytes it is fed, as a raw-mode TTY stream does. */
class FedStdin extends EventEmitter {
  isTTY = true;
  private queue: Buffer[] = [];
  setRawMode() {}
  setEncoding() {}
  ref() {}
  unref() {}
  read(): Buffer | null {
    return this.queue.shift() ?? null;
  }
  feed(bytes: Uint8Array) {
    this.queue.push(Buffer.from(bytes));
    this.emit('readable');
  }
}

const base = builtInRules();
const flow = buildFlow(base);
const engine = buildEngine(base);

/** Byte strings as a terminal could send them: anything at all, and pieces of escape sequences. */
const bytes = fc.oneof(
  fc.uint8Array({ maxLength: 40 }),
  fc.array(fc.constantFrom('\x1b[0m', '\x1b[31m', '\x1b', '[', '\x1b[2J', '\x1b]0;t\x07', '\x9b', '\x1bO', '\x1b[200~', '\x1b[201~', '\r', '\n', '\x7f', 'é', '\u{1F600}', 'back', '1', 'shunt', ' '), { maxLength: 12 }).map((parts) => new TextEncoder().encode(parts.join(''))),
);

describe('bytes at the terminal (property test, real input path)', () => {
  it('are taken or refused, and the dialogue goes on', async () => {
    const stdin = new FedStdin();
    const stdout = new FakeStdout(80);
    const app = render(<Dialogue ctx={{ flow }} engine={engine} safetyNotice={base.safety.notice} color={false} />, {
      stdout: stdout as unknown as NodeJS.WriteStream,
      stdin: guardedStdin(stdin as unknown as NodeJS.ReadStream),
      patchConsole: false,
      exitOnCtrlC: false,
    });
    await settle(20);
    try {
      await fc.assert(
        fc.asyncProperty(bytes, async (b) => {
          // Ctrl-C (0x03) ends the dialogue on purpose; every other byte must be survived.
          const fed = b.filter((x) => x !== 0x03);
          expect(() => stdin.feed(fed)).not.toThrow();
          await settle(1);
        }),
        { numRuns: 300 },
      );
      await settle(20);
      expect(stdout.written).toContain('> ');
    } finally {
      app.unmount();
    }
  }, 60_000);
});

describe('the input filter', () => {
  it('takes out colour codes and other escape sequences, keeping text, Enter and Backspace', () => {
    const f = inputFilter();
    expect(f('\x1b[31mred\x1b[0m\r')).toBe('red\r');
    expect(f('a\x1b]0;title\x07b\x9bc\x7f')).toBe('abc\x7f');
  });

  it('marks the line breaks of a bracketed paste, even when the paste comes in several chunks', () => {
    const f = inputFilter();
    expect(f('\x1b[200~line one\nline')).toBe(`line one${PASTED_LINE_BREAK}line`);
    expect(f(' two\r\n\x03three\x1b[201~\r')).toBe(` two${PASTED_LINE_BREAK}three\r`);
  });
});
