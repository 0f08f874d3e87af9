/** Writes schemas/*.schema.json from the zod schemas: `npm run schemas`. A test keeps them in step. */
import { writeFileSync } from 'node:fs';
import { publishedSchemas } from '../src/knowledge/json-schemas.js';

for (const [name, schema] of Object.entries(publishedSchemas())) {
  writeFileSync(new URL(`../schemas/${name}`, import.meta.url), JSON.stringify(schema, null, 2) + '\n');
  process.stdout.write(`wrote schemas/${name}\n`);
}
