import { SettingsError, type Assignment } from '../checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';
import { ApiError } from '../errors.ts';

/** Validated settings, or a 400 naming each field under `prefix`. */
export function assignmentOf(settings: unknown, prefix = 'body.settings'): Assignment {
  try {
    return parseAssignment(settings);
  } catch (error) {
    if (error instanceof SettingsError) {
      throw new ApiError('invalid-input', 'invalid assignment settings', error.issues.map((i) => ({ path: `${prefix}.${i.path}`, message: i.message })));
    }
    throw error;
  }
}
