/**
 * A one-line editor on Ink's useInput. The buffer lives in a ref, so fast typing or a paste that
 * carries Enter inside it still submits exactly what was typed, line by line.
 */
import { useRef, useState } from 'react';
import { useInput } from 'ink';
import { PASTED_LINE_BREAK } from './guarded-stdin.js';

/** Enough for any answer's limit and a margin, so an over-long paste is refused by its length, not cut here. */
const MAX_BUFFER = 10_000;

/**
 * `multiline`: the prompt takes free text, so a pasted paragraph is one answer: line breaks
 * inside a paste (marked by the terminal's bracketed paste, or coming in one chunk with more
 * text after them) become spaces, and only a final Enter submits.
 */
export function useLineInput(onSubmit: (line: string) => void, onInterrupt: () => void, isActive = true, multiline = false): string {
  const buffer = useRef('');
  const [, redraw] = useState(0);
  useInput((input, key) => {
    if (key.ctrl && input === 'c') return onInterrupt();
    if (key.return) {
      const line = buffer.current;
      buffer.current = '';
      redraw((n) => n + 1);
      onSubmit(line);
      return;
    }
    if (key.backspace || key.delete) {
      buffer.current = buffer.current.slice(0, -1);
      redraw((n) => n + 1);
      return;
    }
    if (key.ctrl || key.meta || key.escape || key.tab || key.upArrow || key.downArrow || key.leftArrow || key.rightArrow) return;
    let text = input.replaceAll(PASTED_LINE_BREAK, multiline ? ' ' : '\n');
    if (multiline) {
      const submits = /[\r\n]$/.test(text);
      text = text.replace(/[\r\n]+$/, '').replace(/\r\n|\r|\n/g, ' ') + (submits ? '\n' : '');
    }
    const lines = text.split(/\r\n|\r|\n/);
    buffer.current = (buffer.current + lines[0]).slice(0, MAX_BUFFER);
    for (const next of lines.slice(1)) {
      const line = buffer.current;
      buffer.current = next.slice(0, MAX_BUFFER);
      onSubmit(line);
    }
    redraw((n) => n + 1);
  }, { isActive });
  return buffer.current;
}
