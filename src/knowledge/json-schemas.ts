/** The published JSON Schemas of the data files, generated from the zod schemas (input mode). */
import * as z from 'zod';
import { caseSchema } from './case-schema.js';

export function publishedSchemas(): Record<string, unknown> {
  return {
    'dc-case-1.schema.json': z.toJSONSchema(caseSchema, { io: 'input', target: 'draft-2020-12' }),
  };
}
