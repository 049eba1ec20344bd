import type { JsonSchema } from './openapi-types.ts';

/** One field of a request body or one parameter, as the API page lists it. */
export interface FieldRow {
  /** Dotted path: `channels[].key` for a field of the objects in the `channels` array. */
  name: string;
  type: string;
  required: boolean;
  constraints: string[];
  description?: string;
}

/** What a local JSON pointer (`#/components/responses/NotFound`) points at in `root`, or undefined. */
export function followPointer(pointer: string, root: unknown): unknown {
  if (!pointer.startsWith('#/')) return undefined;
  return pointer
    .slice(2)
    .split('/')
    .map((s) => s.replace(/~1/g, '/').replace(/~0/g, '~'))
    .reduce<unknown>((node, key) => (node && typeof node === 'object' ? (node as Record<string, unknown>)[key] : undefined), root);
}

/** Follows a local `$ref` (`#/components/schemas/Name`) in `root`; anything else is returned as is. */
export function resolveRef(schema: JsonSchema, root: unknown): JsonSchema {
  if (!schema.$ref) return schema;
  return (followPointer(schema.$ref, root) as JsonSchema | undefined) ?? schema;
}

const isNull = (s: JsonSchema) => s.type === 'null';

/** The schema without its "or null" alternative, and whether null is allowed. */
function withoutNull(schema: JsonSchema): { schema: JsonSchema; nullable: boolean } {
  const alternatives = schema.anyOf ?? schema.oneOf;
  if (alternatives && alternatives.some(isNull)) {
    const rest = alternatives.filter((s) => !isNull(s));
    if (rest.length === 1)
      return { schema: { ...rest[0], description: schema.description ?? rest[0].description, default: schema.default ?? rest[0].default }, nullable: true };
  }
  if (Array.isArray(schema.type) && schema.type.includes('null')) {
    const types = schema.type.filter((t) => t !== 'null');
    return { schema: { ...schema, type: types.length === 1 ? types[0] : types }, nullable: true };
  }
  return { schema, nullable: false };
}

/** A short type name: `string`, `integer or null`, `array of object`, `number or string`, `map of string`. */
export function typeText(schema: JsonSchema, root: unknown): string {
  const { schema: s, nullable } = withoutNull(resolveRef(schema, root));
  const orNull = nullable ? ' or null' : '';
  if (s.$ref) return s.$ref.split('/').pop()! + orNull;
  const alternatives = s.anyOf ?? s.oneOf;
  if (alternatives) return alternatives.map((a) => typeText(a, root)).join(' or ') + orNull;
  if (s.const !== undefined) return `the value ${JSON.stringify(s.const)}${orNull}`;
  if (s.enum) return (typeof s.enum[0] === 'string' ? 'string' : 'value') + orNull;
  const type = Array.isArray(s.type) ? s.type.join(' or ') : s.type;
  if (type === 'array') return `array of ${s.items ? typeText(s.items, root) : 'anything'}${orNull}`;
  if (type === 'object' && !s.properties && typeof s.additionalProperties === 'object') return `map of ${typeText(s.additionalProperties, root)}${orNull}`;
  return (type ?? 'any') + orNull;
}

// zod writes these bounds for every integer; they say nothing a reader needs.
const SAFE = Number.MAX_SAFE_INTEGER;
const meaningful = (n: number | undefined): n is number => typeof n === 'number' && Math.abs(n) < SAFE;

/** The checks a value must pass, in words: lengths, bounds, pattern, allowed values, size, default. */
export function constraintsOf(schema: JsonSchema, root: unknown): string[] {
  const { schema: s } = withoutNull(resolveRef(schema, root));
  const out: string[] = [];
  if (s.enum) out.push(`one of ${s.enum.map((v) => JSON.stringify(v)).join(', ')}`);
  if (s.minLength !== undefined && s.maxLength !== undefined) out.push(`${s.minLength}–${s.maxLength} characters`);
  else if (s.minLength !== undefined) out.push(`at least ${s.minLength} characters`);
  else if (s.maxLength !== undefined) out.push(`at most ${s.maxLength} characters`);
  if (meaningful(s.minimum)) out.push(`≥ ${s.minimum}`);
  if (meaningful(s.exclusiveMinimum)) out.push(`> ${s.exclusiveMinimum}`);
  if (meaningful(s.maximum)) out.push(`≤ ${s.maximum}`);
  if (meaningful(s.exclusiveMaximum)) out.push(`< ${s.exclusiveMaximum}`);
  if (s.minItems !== undefined) out.push(`at least ${s.minItems} items`);
  if (s.maxItems !== undefined) out.push(`at most ${s.maxItems} items`);
  if (s.format) out.push(`format ${s.format}`);
  if (s.pattern) out.push(`matches ${s.pattern}`);
  if (s.default !== undefined) out.push(`default ${JSON.stringify(s.default)}`);
  return out;
}

/**
 * The fields of an object schema as rows, nested objects and arrays of objects flattened into
 * dotted names (`channels[].key`), so a body reads as one list. A schema that is not an object
 * (a CSV text body, say) gives a single row named `(body)`.
 */
export function schemaFields(schema: JsonSchema, root: unknown, prefix = '', depth = 0): FieldRow[] {
  const s = withoutNull(resolveRef(schema, root)).schema;
  if (!s.properties) {
    return prefix
      ? []
      : [{ name: '(body)', type: typeText(schema, root), required: true, constraints: constraintsOf(schema, root), description: s.description }];
  }
  const required = new Set(s.required ?? []);
  const rows: FieldRow[] = [];
  for (const [key, child] of Object.entries(s.properties)) {
    const name = `${prefix}${key}`;
    const resolved = withoutNull(resolveRef(child, root)).schema;
    rows.push({
      name,
      type: typeText(child, root),
      required: required.has(key),
      constraints: constraintsOf(child, root),
      description: resolved.description ?? child.description,
    });
    if (depth >= 4) continue;
    if (resolved.properties) rows.push(...schemaFields(resolved, root, `${name}.`, depth + 1));
    else if (resolved.items && withoutNull(resolveRef(resolved.items, root)).schema.properties)
      rows.push(...schemaFields(resolved.items, root, `${name}[].`, depth + 1));
  }
  return rows;
}
