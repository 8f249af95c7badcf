import { z } from 'zod';
import type { FormField, FormGroup } from '../../schemas/api/kinds.ts';
import type { Tolerance } from '../../schemas/common.ts';

/** A setting's words: its label, or the label with help, option labels and the unit of an absolute tolerance. */
export type FieldWords = string | { label: string; help?: string; options?: Record<string, string>; unit?: string };

/**
 * How a kind's settings form is laid out: fieldsets of top-level settings (a setting that is an object
 * of settings stands for each of its own), words for every field by path, and the settings the form
 * leaves as stored (a class dataset, reference bands), which the API edits.
 */
export interface FormLayout {
  groups: Array<{ label: string; help?: string; keys: string[] }>;
  words: Record<string, FieldWords>;
  kept: string[];
}

/**
 * Every kind's settings carry the late policy (schemas/common.ts LatePolicy): one fieldset, the same
 * in every kind's form, which the kind's layout does not name.
 */
const LATE_WORK = {
  label: 'Late work',
  help: 'For work stored after the section’s deadline.',
  keys: ['late'],
  words: {
    'late.policy': { label: 'Late work is', options: { grade: 'graded as if on time', deduct: 'graded, less the points below', hold: 'kept back until a TA accepts it' } },
    'late.points': { label: 'Points taken off late work', help: 'only when late work is graded less points' },
  } satisfies Record<string, FieldWords>,
};

/** The part of a JSON Schema document the form is made from. */
interface Node {
  type?: string;
  enum?: string[];
  const?: unknown;
  default?: unknown;
  minimum?: number;
  maximum?: number;
  exclusiveMinimum?: number;
  properties?: Record<string, Node>;
}

const isTolerance = (node: Node) => node.type === 'object' && node.properties !== undefined && Object.keys(node.properties).sort().join() === 'absolute,relative';

/**
 * The settings form of a kind, made from its settings schema (types, choices, defaults, bounds) and
 * the layout's words. Every setting is either in a fieldset or kept, and every field has words: a
 * setting added to the schema without them fails here, when the kind is described, not on the page.
 */
export function settingsForm(settings: z.ZodObject, layout: FormLayout): FormGroup[] {
  const root = z.toJSONSchema(settings, { io: 'input', unrepresentable: 'any' }) as Node;
  const top = root.properties ?? {};
  const groups = [...layout.groups, LATE_WORK];
  const placed = [...groups.flatMap((g) => g.keys), ...layout.kept];
  const missing = Object.keys(top).filter((key) => top[key].const === undefined && !placed.includes(key));
  if (missing.length) throw new Error(`settings neither in the form nor kept: ${missing.join(', ')}`);

  function words(path: string): Exclude<FieldWords, string> {
    const w = layout.words[path] ?? (LATE_WORK.words as Record<string, FieldWords>)[path];
    if (w === undefined) throw new Error(`no label for the setting ${path}`);
    return typeof w === 'string' ? { label: w } : w;
  }

  function fields(path: string, node: Node | undefined): FormField[] {
    if (!node) throw new Error(`no setting ${path}`);
    if (node.type === 'object' && !isTolerance(node)) return Object.entries(node.properties ?? {}).flatMap(([key, child]) => fields(`${path}.${key}`, child));
    const { label, help, options, unit } = words(path);
    const base = { name: path, label, ...(help && { help }) };
    if (isTolerance(node)) return [{ ...base, type: 'tolerance', default: node.default as Tolerance, ...(unit && { unit }) }];
    if (node.enum) {
      return [{ ...base, type: 'select', default: typeof node.default === 'string' ? node.default : node.enum[0], options: node.enum.map((value) => ({ value, label: options?.[value] ?? value })) }];
    }
    if (node.type === 'boolean') return [{ ...base, type: 'boolean', default: node.default === true }];
    if (node.type === 'number' || node.type === 'integer') {
      const exclusive = node.exclusiveMinimum !== undefined;
      return [
        {
          ...base,
          type: 'number',
          ...(typeof node.default === 'number' && { default: node.default }),
          ...(exclusive ? { min: node.exclusiveMinimum, minExclusive: true } : node.minimum !== undefined && { min: node.minimum }),
          ...(node.maximum !== undefined && { max: node.maximum }),
          ...(unit && { unit }),
          ...(node.type === 'integer' && { integer: true }),
          optional: node.default === undefined,
        },
      ];
    }
    if (node.type === 'string') return [{ ...base, type: 'text', default: typeof node.default === 'string' ? node.default : '' }];
    throw new Error(`the setting ${path} has no form control (type ${node.type})`);
  }

  return groups.map((g) => ({ type: 'group', label: g.label, ...(g.help && { help: g.help }), fields: g.keys.flatMap((key) => fields(key, top[key])) }));
}
