import { ApiError } from '../errors.ts';
import { assignmentOf } from './assignment-of.ts';
import type { Assignment } from '../checks/check.ts';

type Json = Record<string, unknown>;

const isObject = (value: unknown): value is Json => typeof value === 'object' && value !== null && !Array.isArray(value);

/** Settings with their top-level nulls left out: null states that a setting is not set (its default, if it has one, applies). */
function withoutNulls(settings: Json): Json {
  return Object.fromEntries(Object.entries(settings).filter(([, v]) => v !== null));
}

/** An assignment keeps its kind: settings naming another are refused before they are read by that kind's schema. */
function keepKind(settings: Json, kind: string): void {
  if ('kind' in settings && settings.kind !== kind) throw new ApiError('invalid-input', undefined, [{ path: 'body.settings.kind', message: `the assignment's kind is ${kind}` }]);
}

/** New settings, validated whole; a top-level null means not set. */
export function newSettings(settings: unknown): Assignment {
  return assignmentOf(isObject(settings) ? withoutNulls(settings) : settings);
}

/**
 * Settings that replace the current ones whole (PUT). Every setting the assignment has must be stated,
 * null clearing an optional one, so that a PUT of a few settings cannot drop the rest in silence.
 */
export function replacedSettings(current: { kind: string; settings: unknown }, settings: Json): Assignment {
  const missing = Object.keys(current.settings as Json).filter((key) => !(key in settings));
  if (missing.length > 0) {
    throw new ApiError(
      'missing-settings',
      undefined,
      missing.map((key) => ({ path: `body.settings.${key}`, message: 'not stated: give its value, or null to clear it, or send PATCH to change only some settings' })),
    );
  }
  keepKind(settings, current.kind);
  return newSettings(settings);
}

/**
 * JSON Merge Patch (RFC 7396) of `patch` onto `target`: objects merge key by key at every depth, a null
 * removes the key, anything else (a number, a text, an array) replaces what was there.
 */
export function mergePatch(target: unknown, patch: unknown): unknown {
  if (!isObject(patch)) return patch;
  const out: Json = isObject(target) ? { ...target } : {};
  for (const [key, value] of Object.entries(patch)) {
    if (value === null) delete out[key];
    else out[key] = mergePatch(out[key], value);
  }
  return out;
}

/** The current settings with a merge patch applied (PATCH), validated whole after merging. */
export function patchedSettings(current: { kind: string; settings: unknown }, patch: Json): Assignment {
  keepKind(patch, current.kind);
  return assignmentOf(mergePatch(current.settings, patch));
}
