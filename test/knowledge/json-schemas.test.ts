import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { publishedSchemas } from '../../src/knowledge/json-schemas.js';
import { caseSchema } from '../../src/knowledge/case-schema.js';

describe('published JSON Schemas', () => {
  it('match the zod schemas (run `npm run schemas` after changing one)', () => {
    for (const [name, schema] of Object.entries(publishedSchemas())) {
      const onDisk = JSON.parse(readFileSync(new URL(`../../schemas/${name}`, import.meta.url), 'utf8'));
      expect(onDisk, name).toEqual(JSON.parse(JSON.stringify(schema)));
    }
  });
});

describe('the case schema, as an editor uses it', () => {
  const schema = publishedSchemas()['dc-case-1.schema.json'] as Record<string, unknown>;

  it('has an $id and a description for every property', () => {
    expect(schema.$id).toBe('urn:dctriage:schema:dc-case-1');
    const undescribed: string[] = [];
    const walk = (node: unknown, path: string) => {
      if (!node || typeof node !== 'object') return;
      const n = node as Record<string, unknown>;
      for (const [k, v] of Object.entries((n.properties ?? {}) as Record<string, Record<string, unknown>>)) {
        if (!v.description) undescribed.push(`${path}.${k}`);
        walk(v, `${path}.${k}`);
      }
      for (const k of ['anyOf', 'oneOf', 'allOf', 'prefixItems']) if (Array.isArray(n[k])) for (const x of n[k] as unknown[]) walk(x, path);
      if (n.items) walk(n.items, `${path}[]`);
      for (const [k, v] of Object.entries((n.$defs ?? {}) as Record<string, unknown>)) walk(v, k);
    };
    walk(schema, '');
    expect(undescribed).toEqual([]);
  });

  it('gives quantities a pattern that tells a voltage from a current', () => {
    const reading = (((schema.$defs as Record<string, Record<string, unknown>>)['dc-case-1']!.properties as Record<string, Record<string, unknown>>).readings!.properties as Record<string, { anyOf: { pattern?: string }[] }>).armatureVoltage!;
    const pattern = new RegExp(reading.anyOf.find((a) => a.pattern)!.pattern!, 'u');
    expect(pattern.test('221 V')).toBe(true);
    expect(pattern.test('5 A')).toBe(false);
  });

  it('lets a case file name its schema with "$schema"', () => {
    const c = caseSchema.safeParse({ $schema: '../schemas/dc-case-1.schema.json', format: 'dc-case/1', machine: { connection: 'shunt' } });
    expect(c.success).toBe(true);
  });
});
