/**
 * The terminal's input as the dialogue reads it: escape sequences (a pasted colour code, a
 * bracketed-paste marker, an arrow key) and C1 control characters are taken out before Ink sees
 * them. Ink 6.8 throws on some of them (`\x1b[0m` reads as a Ctrl key with no name), and the
 * dialogue uses none: it needs text, Enter, Backspace and Ctrl-C, which are kept.
 */

/** CSI (`ESC [` … final byte), OSC and DCS strings (to BEL or ST, or the chunk's end), SS3 and two-byte escapes, and C1 controls. */
// eslint-disable-next-line no-control-regex
const SEQUENCE = /\u001b(?:\[[0-?]*[ -/]*[@-~]?|[\]P^_][^\u0007\u001b]*(?:\u0007|\u001b\\)?|O.?|[\s\S]?)|[\u0080-\u009f]/g;

export function withoutEscapes(chunk: string): string {
  return chunk.replace(SEQUENCE, '');
}

/** A line break inside a paste: the line editor keeps it in a free-text answer instead of submitting. */
export const PASTED_LINE_BREAK = '\u2028';
// eslint-disable-next-line no-control-regex
const PASTE_MARKS = /(\u001b\[20[01]~)/;

/**
 * The filter for one terminal's input, chunk by chunk: escape sequences out, and inside a
 * bracketed paste (between ESC[200~ and ESC[201~, which may come in different chunks) line breaks
 * marked as pasted and other control characters (a pasted Ctrl-C among them) dropped.
 */
export function inputFilter(): (chunk: string) => string {
  let pasting = false;
  return (chunk) => {
    let out = '';
    for (const part of chunk.split(PASTE_MARKS)) {
      if (part === '\u001b[200~') pasting = true;
      else if (part === '\u001b[201~') pasting = false;
      // eslint-disable-next-line no-control-regex
      else out += pasting ? withoutEscapes(part).replace(/\r\n|\r|\n/g, PASTED_LINE_BREAK).replace(/[\u0000-\u001f\u007f]/g, '') : withoutEscapes(part);
    }
    return out;
  };
}

/** `stdin` with every chunk Ink reads passed through the input filter; everything else is the stream itself. */
export function guardedStdin(stdin: NodeJS.ReadStream): NodeJS.ReadStream {
  const filter = inputFilter();
  return new Proxy(stdin, {
    get(target, key) {
      if (key === 'read') {
        return (size?: number) => {
          const chunk: unknown = target.read(size);
          if (chunk === null) return null;
          return filter(typeof chunk === 'string' ? chunk : Buffer.from(chunk as Uint8Array).toString('utf8'));
        };
      }
      const value: unknown = Reflect.get(target, key, target);
      return typeof value === 'function' ? (value as (...a: unknown[]) => unknown).bind(target) : value;
    },
  });
}
