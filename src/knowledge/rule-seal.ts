/**
 * A record of rule files already proved valid. The build validates the built-in rule folder with
 * the full schemas and writes down, for each file, the schema it passed and the SHA-256 of its
 * text. At run time a file whose text hashes to a recorded digest has passed that very schema, so
 * it is used as parsed JSON without a second pass; any other file, and any file once edited, is
 * validated in full. The cross-references between files are always checked again.
 *
 * Why: validating the 320 built-in rules was about 50 ms of every start, for files that only
 * change with a release. The seal is written by the same build as the schemas it vouches for.
 */
import { createHash } from 'node:crypto';
import { isDeepStrictEqual } from 'node:util';
import * as z from 'zod';
import { readValidated } from './read-json.js';

export const RULE_SEAL_FORMAT = 'dctriage-rule-seal/1';

const sealFile = z
  .object({
    format: z.literal(RULE_SEAL_FORMAT),
    passed: z.array(z.string().regex(/^[a-z.-]+:[0-9a-f]{64}$/)),
  })
  .strict();

/** Keys "schema:sha256" of the file contents that passed their schema at build time. */
export type RuleSeal = ReadonlySet<string>;

export function sealKey(schemaName: string, text: string): string {
  return `${schemaName}:${createHash('sha256').update(text).digest('hex')}`;
}

/**
 * Whether the parse changed nothing, so the file as read holds what the schema would return (the
 * keys may come in the file's order rather than the schema's). Only such files are sealed: a
 * schema that dropped, defaulted or transformed a field would make them differ.
 */
export function parseKeptFileAsIs(input: unknown, output: unknown): boolean {
  return isDeepStrictEqual(input, output);
}

export function sealToJson(keys: Iterable<string>): string {
  return JSON.stringify({ format: RULE_SEAL_FORMAT, passed: [...keys].sort() }, null, 2) + '\n';
}

/**
 * The seal written beside the bundle, or none. A missing, unreadable or malformed seal is not an
 * error: every file is then validated in full, as when running from source.
 */
export function readRuleSeal(file: string): RuleSeal | undefined {
  const read = readValidated(file, sealFile);
  return read.ok ? new Set(read.value.passed) : undefined;
}
