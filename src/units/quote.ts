/**
 * What someone typed, safe to repeat in a one-line message: control characters and escape
 * sequences shown as escapes (never sent to the terminal), and long text cut short.
 */
export const MAX_QUOTED = 60;

export function quote(text: string, max = MAX_QUOTED): string {
  const cut = text.length > max ? `${text.slice(0, max)}…` : text;
  // JSON string escaping turns newlines, tabs and ESC into \n, \t, \u001b.
  return JSON.stringify(cut);
}

/** A whole message made safe for one terminal line. */
export function oneLine(text: string, max = 600): string {
  // eslint-disable-next-line no-control-regex
  const safe = text.replace(/[\u0000-\u001f\u007f-\u009f]/g, (c) => JSON.stringify(c).slice(1, -1));
  return safe.length > max ? `${safe.slice(0, max)}…` : safe;
}
