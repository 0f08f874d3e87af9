/** Loads a dc-case/1 file and hands the model the plain-number view of it. */
import type { ModelInput } from '../model/expected.js';
import { caseSchema, type CaseFile, type CaseInput } from './case-schema.js';
import { readJson, validate } from './read-json.js';
import { failed, ok, type Result } from './result.js';

export interface LoadedCase {
  job: CaseFile;
  /** The file as written, quantities as typed: what reports and replays repeat. */
  raw: CaseInput;
}

/** Reads a case file once, validating it; `causeIds` is the catalogue its recorded cause must belong to. */
export function loadCaseFile(file: string, causeIds?: ReadonlySet<string>): Result<LoadedCase> {
  const raw = readJson(file);
  return raw.ok ? caseFromJson(file, raw.value, causeIds) : raw;
}

/** A case already read as JSON (from standard input, say); `file` names where it came from. */
export function caseFromJson(file: string, value: unknown, causeIds?: ReadonlySet<string>): Result<LoadedCase> {
  const parsed = validate(file, value, caseSchema);
  if (!parsed.ok) return parsed;
  const cause = parsed.value.outcome?.cause;
  if (causeIds !== undefined && cause !== undefined && !causeIds.has(cause)) {
    return failed({
      code: 'unknown-cause',
      file,
      path: 'outcome.cause',
      message: `"${cause}" is not a cause of the catalogue in use; record a cause not yet in the catalogue as outcome.newCause`,
    });
  }
  // The schema accepted this very value, so it has the input shape.
  return ok({ job: parsed.value, raw: value as CaseInput });
}

export function loadCase(file: string, causeIds?: ReadonlySet<string>): Result<CaseFile> {
  const c = loadCaseFile(file, causeIds);
  return c.ok ? ok(c.value.job) : c;
}

export function modelInput(c: CaseFile): ModelInput {
  return { machine: c.machine, readings: c.readings ?? {} };
}
