/**
 * A one-line editor on Ink's useInput. The buffer lives in a ref, so fast typing or a paste that
 * carries Enter inside it still submits exactly what was typed, line by line.
 */
import { useRef, useState } from 'react';
import { useInput } from 'ink';

export function useLineInput(onSubmit: (line: string) => void, onInterrupt: () => void, isActive = true): string {
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
    const lines = input.split(/\r\n|\r|\n/);
    buffer.current += lines[0];
    for (const next of lines.slice(1)) {
      const line = buffer.current;
      buffer.current = next;
      onSubmit(line);
    }
    redraw((n) => n + 1);
  }, { isActive });
  return buffer.current;
}
