/**
 * Long lines broken at spaces to fit a terminal, each continuation indented under the text it
 * continues: past the line's own indent and its list marker ("1. ", "+ ", "- ", "!! ", "a. ").
 * A word longer than the width (a path) is cut. Lines that fit are left as they are, and so are
 * table rows, which their tables lay out to fit.
 * @example wrapText('  - brush contact drop taken as 2 V total', 24)
 * // '  - brush contact drop\n    taken as 2 V total'
 */
const MARKER = /^(\s*)((?:\d+\.|[a-z]\.|[+\-−!*•↳]+|\?)\s+)?/;

export function wrapText(text: string, width: number): string {
  if (!Number.isFinite(width) || width < 20) return text;
  return text
    .split('\n')
    .map((line) => wrapLine(line.replace(/\s+$/, ''), width))
    .join('\n');
}

const length = (s: string) => [...s].length;

/** A word cut into pieces no longer than `n` (only a path or a URL is ever that long). */
function pieces(word: string, n: number): string[] {
  const chars = [...word];
  const out: string[] = [];
  for (let k = 0; k < chars.length; k += n) out.push(chars.slice(k, k + n).join(''));
  return out;
}

/** A table row (columns apart by two spaces or more): tables are laid out to fit, not reflowed. */
const TABLE_ROW = /\S {2,}\S/;

function wrapLine(line: string, width: number): string {
  if (length(line) <= width || TABLE_ROW.test(line.trimStart())) return line;
  const lead = MARKER.exec(line)![0];
  // A hanging indent that leaves too little room is not worth keeping.
  const hang = Math.min(length(lead), Math.floor(width / 2));
  const lines: string[] = [];
  // The first line keeps the indent and the marker as they are.
  const indentOnly = lead.trim() === '';
  let current = indentOnly ? lead : lead.trimEnd();
  let hasText = !indentOnly;
  for (const word of line.slice(lead.length).split(/ +/).filter(Boolean)) {
    for (const piece of pieces(word, width - hang)) {
      const joined = hasText ? `${current} ${piece}` : `${current}${piece}`;
      if (hasText && length(joined) > width) {
        lines.push(current);
        current = ' '.repeat(hang) + piece;
      } else current = joined;
      hasText = true;
    }
  }
  if (hasText) lines.push(current);
  return lines.join('\n');
}
