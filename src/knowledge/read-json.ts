/** Reads a JSON data file and validates it, refusing oversized files before reading them. */
import { readFileSync, statSync } from 'node:fs';
import type * as z from 'zod';
import { failed, ok, type Issue, type Result } from './result.js';
import { oneLine, quote } from '../units/quote.js';

/** Case, machine and rule files are small; anything larger is refused unread. */
export const MAX_FILE_BYTES = 1024 * 1024;

export function readJson(file: string): Result<unknown> {
  const r = readJsonFile(file);
  return r.ok ? ok(r.value.value) : r;
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
    text = readFileSync(file, 'utf8');
  } catch (e) {
    return failed({ code: 'unreadable', file, path: '', message: describeFsError(e) });
  }
  const value = parseJsonText(file, text);
  return value.ok ? ok({ text, value: value.value }) : value;
}

/** JSON text read elsewhere (standard input), with the same message as a file's. */
export function parseJsonText(file: string, text: string): Result<unknown> {
  try {
    return ok(JSON.parse(text) as unknown);
  } catch (e) {
    return failed({ code: 'not-json', file, path: '', message: `not valid JSON (${oneLine((e as Error).message, 120)})` });
  }
}

export function validate<S extends z.ZodType>(file: string, data: unknown, schema: S, pathPrefix = ''): Result<z.output<S>> {
  const parsed = schema.safeParse(data, { reportInput: true });
  if (parsed.success) return ok(parsed.data);
  return failed(...parsed.error.issues.map((i) => zodIssue(file, i, pathPrefix)));
}

export function readValidated<S extends z.ZodType>(file: string, schema: S): Result<z.output<S>> {
  const raw = readJson(file);
  return raw.ok ? validate(file, raw.value, schema) : raw;
}

export function formatPath(path: ReadonlyArray<PropertyKey>): string {
  return path.reduce<string>((acc, key) => (typeof key === 'number' ? `${acc}[${key}]` : acc ? `${acc}.${String(key)}` : String(key)), '');
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
