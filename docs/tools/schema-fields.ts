import { code, markdownTable } from './markdown-table.ts';

/** The part of JSON Schema (draft 2020-12, as zod writes it) that the field tables read. */
export interface JsonSchema {
  type?: string | string[];
  const?: unknown;
  enum?: unknown[];
  default?: unknown;
  properties?: Record<string, JsonSchema>;
  required?: string[];
  additionalProperties?: JsonSchema | boolean;
  items?: JsonSchema | false;
  prefixItems?: JsonSchema[];
  anyOf?: JsonSchema[];
  oneOf?: JsonSchema[];
  $ref?: string;
  $defs?: Record<string, JsonSchema>;
  pattern?: string;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number | boolean;
  minLength?: number;
  maxLength?: number;
  minItems?: number;
  maxItems?: number;
  description?: string;
}

/** Fields deeper than this are summarised by their keys rather than listed one by one. */
const MAX_DEPTH = 3;
/** A default longer than this is left to the schema file. */
const MAX_DEFAULT = 48;
const NUMBER_TEXT = /^\^\\s\*\[-\+\]\?/;

function resolve(schema: JsonSchema, root: JsonSchema): JsonSchema {
  if (!schema.$ref) return schema;
  const name = schema.$ref.replace(/^#\/\$defs\//, '');
  const target = root.$defs?.[name];
  if (!target) throw new Error(`unresolved $ref ${schema.$ref}`);
  return target;
}

/** The alternatives of a schema, nested anyOf flattened. */
function variants(schema: JsonSchema, root: JsonSchema): JsonSchema[] {
  const s = resolve(schema, root);
  const alternatives = s.anyOf ?? s.oneOf;
  return alternatives ? alternatives.flatMap((v) => variants(v, root)) : [s];
}

function typeOf(schema: JsonSchema, root: JsonSchema): string {
  const names = variants(schema, root).map((s) => {
    if (s.const !== undefined) return code(JSON.stringify(s.const));
    if (s.enum) return s.enum.map((v) => code(JSON.stringify(v))).join(', ');
    // A number may also be sent as text that keeps its written digits.
    if (s.type === 'string' && s.pattern && NUMBER_TEXT.test(s.pattern)) return 'numeric string';
    if (s.type === 'array') {
      if (s.prefixItems) return `[${s.prefixItems.map((p) => typeOf(p, root)).join(', ')}]`;
      return s.items ? `array of ${typeOf(s.items, root)}` : 'array';
    }
    if (s.type === 'object' || s.properties) {
      const keys = Object.keys(s.properties ?? {});
      return keys.length ? `object {${keys.join(', ')}}` : 'object';
    }
    if (Array.isArray(s.type)) return s.type.join(' or ');
    return s.type ?? 'any';
  });
  return [...new Set(names)].join(' or ');
}

function limits(schema: JsonSchema, root: JsonSchema): string {
  const notes = variants(schema, root).flatMap((s) => {
    const out: string[] = [];
    if (s.minLength !== undefined || s.maxLength !== undefined) out.push(`${s.minLength ?? 0}-${s.maxLength ?? '...'} characters`);
    if (s.minItems !== undefined || s.maxItems !== undefined) out.push(`${s.minItems ?? 0}-${s.maxItems ?? '...'} items`);
    if (s.minimum !== undefined) out.push(`>= ${s.minimum}`);
    if (typeof s.exclusiveMinimum === 'number') out.push(`> ${s.exclusiveMinimum}`);
    if (s.maximum !== undefined && s.maximum < Number.MAX_SAFE_INTEGER) out.push(`<= ${s.maximum}`);
    if (s.pattern && !NUMBER_TEXT.test(s.pattern)) out.push(`matches ${code(s.pattern)}`);
    return out;
  });
  return [...new Set(notes)].join('; ');
}

function defaultOf(schema: JsonSchema): string {
  if (schema.default === undefined) return '';
  const text = JSON.stringify(schema.default);
  return text.length <= MAX_DEFAULT ? code(text) : 'yes (see the schema)';
}

/** The object a field's value is, for listing its own fields: the object variant, or an array's items. */
function objectWithin(schema: JsonSchema, root: JsonSchema): { object: JsonSchema; suffix: string } | undefined {
  for (const s of variants(schema, root)) {
    if (s.properties) return { object: s, suffix: '' };
    if (s.type === 'array' && s.items) {
      const items = variants(s.items, root).find((i) => i.properties);
      if (items) return { object: items, suffix: '[]' };
    }
  }
  return undefined;
}

function fieldRows(object: JsonSchema, root: JsonSchema, prefix: string, depth: number): string[][] {
  const required = new Set(object.required ?? []);
  return Object.entries(object.properties ?? {}).flatMap(([name, raw]) => {
    const field = resolve(raw, root);
    const path = `${prefix}${name}`;
    const row = [code(path), typeOf(field, root), required.has(name) ? 'yes' : '', defaultOf(field), limits(field, root)];
    const inner = depth < MAX_DEPTH ? objectWithin(field, root) : undefined;
    return [row, ...(inner ? fieldRows(inner.object, root, `${path}${inner.suffix}.`, depth + 1) : [])];
  });
}

/**
 * A table of a JSON Schema's fields: path, type, whether required (a column left out where nothing is),
 * default, limits.
 */
export function schemaFieldTable(schema: JsonSchema, fieldHeading = 'field'): string {
  const rows = fieldRows(schema, schema, '', 1);
  const anyRequired = rows.some((row) => row[2] !== '');
  const pick = (cells: string[]) => (anyRequired ? cells : cells.filter((_, i) => i !== 2));
  return markdownTable(pick([fieldHeading, 'type', 'required', 'default', 'limits']), rows.map(pick));
}
