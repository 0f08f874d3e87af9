/** Reads a JSON data file and validates it, refusing oversized files before reading them. */
import { closeSync, openSync, readSync, statSync } from 'node:fs';
import type * as z from 'zod';
import { failed, failedWith, ISSUES_PER_FILE, ok, type Issue, type Result } from './result.js';
import { oneLine, quote } from '../units/quote.js';

/** Case, machine and rule files are small; anything larger is refused unread. */
export const MAX_FILE_BYTES = 1024 * 1024;
/** Objects and arrays inside each other: a rule's conditions need a dozen levels; deeper is refused before anything recurses into it. */
export const MAX_DEPTH = 64;

export function readJson(file: string): Result<unknown> {
  const r = readJsonFile(file);
  if (!r.ok) return r;
  const twice = duplicateKeyIssue(file, r.value.text);
  return twice ? failed(twice) : ok(r.value.value);
}

/** The parsed JSON with the text it came from. */
export function readJsonFile(file: string): Result<{ text: string; value: unknown }> {
  let size: number;
  try {
    const st = statSync(file);
    if (!st.isFile()) return failed({ code: 'unreadable', file, path: '', message: 'not a regular file' });
    size = st.size;
  } catch (e) {
    return failed({ code: 'unreadable', file, path: '', message: describeFsError(e) });
  }
  if (size > MAX_FILE_BYTES) {
    return failed({ code: 'too-large', file, path: '', message: `file is ${size} bytes; data files are limited to ${MAX_FILE_BYTES} bytes (1 MiB)` });
  }
  let text: string;
  try {
    // The size stat gives is not trusted: /proc files report 0 and never end. At most one byte over the limit is read.
    const bytes = readAtMost(file, MAX_FILE_BYTES + 1, size);
    if (bytes.length > MAX_FILE_BYTES) return failed({ code: 'too-large', file, path: '', message: `file is over ${MAX_FILE_BYTES} bytes; data files are limited to ${MAX_FILE_BYTES} bytes (1 MiB)` });
    text = bytes.toString('utf8');
  } catch (e) {
    return failed({ code: 'unreadable', file, path: '', message: describeFsError(e) });
  }
  // A byte-order mark is not part of the JSON: some editors on Windows write one.
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  const value = parseJsonText(file, text);
  return value.ok ? ok({ text, value: value.value }) : value;
}

/** JSON text read elsewhere (standard input), with the same messages as a file's. */
export function parseJsonText(file: string, text: string): Result<unknown> {
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  let value: unknown;
  try {
    value = JSON.parse(text) as unknown;
  } catch (e) {
    return failed({ code: 'not-json', file, path: '', message: `not valid JSON (${oneLine((e as Error).message, 120)})` });
  }
  const deep = tooDeep(value);
  if (deep !== undefined) return failed({ code: 'invalid', file, path: deep, message: `nested more than ${MAX_DEPTH} levels deep: data files are limited to ${MAX_DEPTH} levels` });
  return ok(value);
}

/** A key twice in one object, as an issue; the rule loader skips this for files the build sealed. */
export function duplicateKeyIssue(file: string, text: string): Issue | undefined {
  const twice = duplicateKey(text);
  return twice ? { code: 'not-json', file, path: twice.path, message: `the key ${quote(twice.key)} appears twice in one object: only one can count, so the file is refused` } : undefined;
}

/**
 * Reads until the end or until more than `limit` bytes are in, into a buffer sized by what stat
 * said (with room to see the end) and grown when the file holds more: /proc files say 0. Reads
 * stay in whole 4 KiB blocks of at most 64 KiB, as some /proc files take only aligned reads.
 */
function readAtMost(file: string, limit: number, size: number): Buffer {
  const fd = openSync(file, 'r');
  try {
    const block = 4096;
    const piece = 64 * 1024;
    let buffer = Buffer.allocUnsafe(Math.ceil((Math.min(size, limit) + 1) / block) * block);
    let got = 0;
    while (got <= limit) {
      if (got === buffer.length) {
        const bigger = Buffer.allocUnsafe(Math.min(limit + piece, Math.max(2 * buffer.length, got + piece)));
        buffer.copy(bigger, 0, 0, got);
        buffer = bigger;
      }
      const n = readSync(fd, buffer, got, Math.min(piece, buffer.length - got), null);
      if (n === 0) break;
      got += n;
    }
    return buffer.subarray(0, got);
  } finally {
    closeSync(fd);
  }
}

/**
 * The path of the first value nested deeper than MAX_DEPTH, found without recursion: depths alone
 * first (files are small and nearly always shallow), paths only when something is too deep.
 */
function tooDeep(root: unknown): string | undefined {
  return deepest(root, false) ? (deepest(root, true) as string) : undefined;
}

/** Whether a value is nested deeper than MAX_DEPTH; with `withPath`, the path of the first such value. */
function deepest(root: unknown, withPath: boolean): string | boolean {
  const todo: { value: unknown; depth: number; path: PropertyKey[] }[] = [{ value: root, depth: 0, path: [] }];
  for (let next = todo.pop(); next; next = todo.pop()) {
    const { value, depth, path } = next;
    if (value === null || typeof value !== 'object') continue;
    if (depth >= MAX_DEPTH) return withPath ? formatPath(path.slice(0, 12)) + (path.length > 12 ? `… (${path.length} levels)` : '') : true;
    for (const k in value) {
      const v = (value as Record<string, unknown>)[k];
      if (v !== null && typeof v === 'object') todo.push({ value: v, depth: depth + 1, path: withPath ? [...path, Array.isArray(value) ? Number(k) : k] : path });
    }
  }
  return false;
}

export function validate<S extends z.ZodType>(file: string, data: unknown, schema: S, pathPrefix = ''): Result<z.output<S>> {
  const parsed = schema.safeParse(data, { reportInput: true });
  if (parsed.success) return ok(parsed.data);
  const all = parsed.error.issues;
  const shown = all.slice(0, ISSUES_PER_FILE).flatMap((i) => zodIssues(file, i, pathPrefix));
  const more = all.length - Math.min(all.length, ISSUES_PER_FILE);
  return failedWith(more ? [...shown, { code: 'invalid', file, path: '', message: '', more }] : shown);
}

export function readValidated<S extends z.ZodType>(file: string, schema: S): Result<z.output<S>> {
  const raw = readJson(file);
  return raw.ok ? validate(file, raw.value, schema) : raw;
}

export function formatPath(path: ReadonlyArray<PropertyKey>): string {
  return path.reduce<string>((acc, key) => (typeof key === 'number' ? `${acc}[${key}]` : acc ? `${acc}.${String(key)}` : String(key)), '');
}

/**
 * zod says only "Invalid input" when no branch of a union fits (a rule condition with an unknown
 * operator, or no value). The branch the input came closest to says what is wrong: the one with
 * no missing or unknown keys at its top, then the fewest issues.
 */
function closestBranch(issue: z.core.$ZodIssueInvalidUnion): z.core.$ZodIssue[] | undefined {
  const cost = (branch: z.core.$ZodIssue[]) =>
    branch.reduce((sum, i) => sum + (i.code === 'unrecognized_keys' || (i.code === 'invalid_type' && i.path.length <= 1 && ('input' in i ? i.input === undefined : true)) ? 100 : 1), 0);
  return [...issue.errors].sort((a, b) => cost(a) - cost(b))[0];
}

function zodIssues(file: string, issue: z.core.$ZodIssue, prefix: string, depth = 0): Issue[] {
  if (issue.code === 'invalid_union' && issue.message === 'Invalid input' && depth < 8) {
    const path = [prefix, formatPath(issue.path)].filter(Boolean).join('.');
    if ('input' in issue && issue.input === undefined) return [{ code: 'invalid', file, path, message: 'missing: this field is required' }];
    const branch = closestBranch(issue);
    if (branch?.length) return branch.slice(0, ISSUES_PER_FILE).flatMap((i) => zodIssues(file, { ...i, path: [...issue.path, ...i.path] } as z.core.$ZodIssue, prefix, depth + 1));
  }
  return [zodIssue(file, issue, prefix)];
}

function zodIssue(file: string, issue: z.core.$ZodIssue, prefix: string): Issue {
  const path = [prefix, formatPath(issue.path)].filter(Boolean).join('.');
  let message = issue.message;
  if (issue.code === 'unrecognized_keys') message = `unknown field${issue.keys.length > 1 ? 's' : ''} ${issue.keys.slice(0, 5).map((k) => quote(k)).join(', ')}${issue.keys.length > 5 ? ` and ${issue.keys.length - 5} more` : ''}`;
  const got = 'input' in issue && issue.input !== undefined && typeof issue.input !== 'object' ? `${quote(String(issue.input))}: ` : '';
  if (issue.code === 'invalid_value') message = `${got}expected one of ${issue.values.map((v) => JSON.stringify(v)).join(', ')}`;
  else if (issue.code === 'invalid_type' || issue.code === 'invalid_format' || issue.code === 'too_big' || issue.code === 'too_small') message = `${got}${message}`;
  return { code: 'invalid', file, path, message };
}

function describeFsError(e: unknown): string {
  const code = (e as NodeJS.ErrnoException).code;
  if (code === 'ENOENT') return 'no such file';
  if (code === 'EACCES') return 'permission denied';
  if (code === 'EISDIR') return 'is a folder, not a file';
  return (e as Error).message;
}

/**
 * The first key that appears twice in one object, with the object's path: JSON.parse keeps the
 * last silently, so a rule edited in two places would change without anyone seeing which counts.
 * A scan of the text that is known to be valid JSON, with a stack instead of recursion; paths are
 * followed only in a second scan, once a file is known to hold a key twice.
 */
function duplicateKey(text: string): { key: string; path: string } | undefined {
  return scanKeys(text, false) ? scanKeys(text, true) : undefined;
}

function scanKeys(text: string, withPath: boolean): { key: string; path: string } | undefined {
  const frames: { keys?: Set<string>; path: PropertyKey[]; index: number }[] = [];
  let pendingKey: string | undefined;
  const here = () => frames.at(-1);
  const childPath = () => {
    const f = here();
    if (!f || !withPath) return [];
    return f.keys ? [...f.path, pendingKey ?? ''] : [...f.path, f.index];
  };
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (c === 0x22 /* " */) {
      let j = i + 1;
      let escaped = false;
      while (text.charCodeAt(j) !== 0x22) {
        if (text.charCodeAt(j) === 0x5c /* \ */) {
          escaped = true;
          j += 2;
        } else j++;
      }
      const f = here();
      let k = j + 1;
      while (k < text.length && (text[k] === ' ' || text[k] === '\t' || text[k] === '\n' || text[k] === '\r')) k++;
      if (f?.keys && text[k] === ':') {
        const key = escaped ? (JSON.parse(text.slice(i, j + 1)) as string) : text.slice(i + 1, j);
        if (f.keys.has(key)) return { key, path: formatPath(f.path) };
        f.keys.add(key);
        pendingKey = key;
      }
      i = j;
    } else if (c === 0x7b /* { */ || c === 0x5b /* [ */) {
      frames.push({ path: childPath(), index: 0, ...(c === 0x7b ? { keys: new Set<string>() } : {}) });
    } else if (c === 0x7d /* } */ || c === 0x5d /* ] */) frames.pop();
    else if (c === 0x2c /* , */) {
      const f = here();
      if (f && !f.keys) f.index++;
    }
  }
  return undefined;
}
