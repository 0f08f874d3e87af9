/** The published JSON Schemas of the data files, generated from the zod schemas (input mode). */
import * as z from 'zod';
import { caseSchema } from './case-schema.js';
import { causesFile, checksFile, draftFile, questionsFile, ruleFile, safetyFile, sharedConditionsFile } from './rulebase-schema.js';

/** The case schema's identifier: a name, not an address; editors find the file through a case's "$schema". */
export const CASE_SCHEMA_ID = 'urn:dctriage:schema:dc-case-1';

const schemaOf = (s: z.ZodType) => z.toJSONSchema(s, { io: 'input', target: 'draft-2020-12' });

export function publishedSchemas(): Record<string, unknown> {
  return {
    'dc-case-1.schema.json': { $id: CASE_SCHEMA_ID, ...schemaOf(caseSchema) },
    'causes.schema.json': schemaOf(causesFile),
    'checks.schema.json': schemaOf(checksFile),
    'questions.schema.json': schemaOf(questionsFile),
    'safety.schema.json': schemaOf(safetyFile),
    'conditions.schema.json': schemaOf(sharedConditionsFile),
    'rule-file.schema.json': schemaOf(ruleFile),
    'draft.schema.json': schemaOf(draftFile),
  };
}
