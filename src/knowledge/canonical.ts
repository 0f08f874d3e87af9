/**
 * Stable key order for files people review as diffs: keys in the order the schema declares
 * them, unknown keys after them alphabetically, 2-space indentation, a final newline.
 */
import * as z from 'zod';

function unwrap(s: z.ZodType): z.ZodType {
  for (;;) {
    if (s instanceof z.ZodOptional || s instanceof z.ZodNullable || s instanceof z.ZodDefault) s = s.unwrap() as z.ZodType;
    // A preprocess (a transform in front of a schema) keeps its shape on the out side.
    else if (s instanceof z.ZodPipe) s = (s.in instanceof z.ZodTransform ? s.out : s.in) as z.ZodType;
    else if (s instanceof z.ZodLazy) s = s.unwrap() as z.ZodType;
    else return s;
  }
}

/** For a union, the option the value is an instance of. */
function branch(s: z.ZodType, value: unknown): z.ZodType {
  if (!(s instanceof z.ZodUnion)) return s;
  const options = s.options as readonly z.ZodType[];
  return unwrap(options.find((o) => o.safeParse(value).success) ?? options[0]!);
}

export function orderKeys(value: unknown, schema: z.ZodType): unknown {
  const s = branch(unwrap(schema), value);
  if (Array.isArray(value)) return s instanceof z.ZodArray ? value.map((v) => orderKeys(v, s.element as z.ZodType)) : value;
  if (value === null || typeof value !== 'object') return value;
  const obj = value as Record<string, unknown>;
  const shape = s instanceof z.ZodObject ? (s.shape as Record<string, z.ZodType>) : {};
  const known = Object.keys(shape).filter((k) => k in obj);
  const rest = Object.keys(obj).filter((k) => !(k in shape)).sort();
  const out: Record<string, unknown> = {};
  for (const k of known) out[k] = orderKeys(obj[k], shape[k]!);
  for (const k of rest) out[k] = obj[k];
  return out;
}

export function stableJson(value: unknown, schema: z.ZodType): string {
  return JSON.stringify(orderKeys(value, schema), null, 2) + '\n';
}
