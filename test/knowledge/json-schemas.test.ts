import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { publishedSchemas } from '../../src/knowledge/json-schemas.js';

describe('published JSON Schemas', () => {
  it('match the zod schemas (run `npm run schemas` after changing one)', () => {
    for (const [name, schema] of Object.entries(publishedSchemas())) {
      const onDisk = JSON.parse(readFileSync(new URL(`../../schemas/${name}`, import.meta.url), 'utf8'));
      expect(onDisk, name).toEqual(JSON.parse(JSON.stringify(schema)));
    }
  });
});
