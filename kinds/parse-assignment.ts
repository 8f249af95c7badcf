import { issuesOf, SettingsError, type Assignment } from '../server/checks/check.ts';
import { kindFor } from './registry.ts';

/** Validates assignment settings (their `kind` chooses the schema) and fills defaults. */
export function parseAssignment(input: unknown): Assignment {
  const kindName = typeof input === 'object' && input !== null ? (input as { kind?: unknown }).kind : undefined;
  const kind = typeof kindName === 'string' ? kindFor(kindName) : undefined;
  if (!kind) {
    throw new SettingsError([{ path: 'kind', message: `unknown experiment kind ${JSON.stringify(kindName)}` }]);
  }
  const parsed = kind.settingsSchema.safeParse(input);
  if (!parsed.success) throw new SettingsError(issuesOf(parsed.error));
  const issues = kind.settingsIssues(parsed.data);
  if (issues.length > 0) throw new SettingsError(issues);
  return { kind, settings: parsed.data };
}
