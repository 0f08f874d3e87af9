/** Loads a dc-case/1 file and hands the model the plain-number view of it. */
import type { ModelInput } from '../model/expected.js';
import { caseSchema, type CaseFile } from './case-schema.js';
import { readValidated } from './read-json.js';
import { failed, type Result } from './result.js';

export function loadCase(file: string, causeIds?: ReadonlySet<string>): Result<CaseFile> {
  const parsed = readValidated(file, caseSchema);
  if (!parsed.ok || causeIds === undefined) return parsed;
  const cause = parsed.value.outcome?.cause;
  if (cause !== undefined && !causeIds.has(cause)) {
    return failed({
      code: 'unknown-cause',
      file,
      path: 'outcome.cause',
      message: `"${cause}" is not a cause of the catalogue in use; record a cause not yet in the catalogue as outcome.newCause`,
    });
  }
  return parsed;
}

export function modelInput(c: CaseFile): ModelInput {
  return { machine: c.machine, readings: c.readings ?? {} };
}
