/**
 * Control characters in text from a file (a rule title, a check's how) must never reach a
 * terminal raw: an escape sequence can clear the screen, print a fake warning, set the window
 * title or hide a link. They are made visible as `\u001b`-style escapes, and reported.
 */

/** C0 (newline and tab too: rule text is one line), DEL, C1, the line and paragraph separators, and the bidirectional overrides that reorder what is shown. */
// eslint-disable-next-line no-control-regex
const CONTROL = /[\u0000-\u001f\u007f-\u009f\u2028\u2029\u200e\u200f\u202a-\u202e\u2066-\u2069]/g;
// eslint-disable-next-line no-control-regex
const HAS_CONTROL = /[\u0000-\u001f\u007f-\u009f\u2028\u2029\u200e\u200f\u202a-\u202e\u2066-\u2069]/;

export function visible(text: string): string {
  return text.replace(CONTROL, (c) => `\\u${c.charCodeAt(0).toString(16).padStart(4, '0')}`);
}

export function hasControl(text: string): boolean {
  return HAS_CONTROL.test(text);
}

/** The field paths ("causes[3].title") of every string in `value` that holds a control character. */
export function controlPaths(value: unknown, path = ''): string[] {
  if (typeof value === 'string') return hasControl(value) ? [path] : [];
  if (Array.isArray(value)) return value.flatMap((v, k) => controlPaths(v, `${path}[${k}]`));
  if (value !== null && typeof value === 'object') return Object.entries(value).flatMap(([k, v]) => controlPaths(v, path ? `${path}.${k}` : k));
  return [];
}

/** A copy of `value` with every string made visible; the same object when there is nothing to change. */
export function withVisibleText<T>(value: T): T {
  if (typeof value === 'string') return (hasControl(value) ? visible(value) : value) as T;
  if (Array.isArray(value)) return value.map((v) => withVisibleText(v)) as T;
  // fromEntries defines each key as an own property, "__proto__" included: no prototype is touched.
  if (value !== null && typeof value === 'object') return Object.fromEntries(Object.entries(value).map(([k, v]) => [k, withVisibleText(v)])) as T;
  return value;
}

/** The text with each run of control characters as one space: for typed text, where a line break was only layout. */
export function spacedControls(text: string): string {
  return text.replace(new RegExp(`${CONTROL.source}+`, 'g'), ' ');
}
