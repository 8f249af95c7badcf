import { checkAndRead, type Assignment, type CheckedSubmission } from '../checks/check.ts';
import { parseAssignment } from '../../kinds/parse-assignment.ts';

// A worker is sent the same settings with every batch of an assignment: parse them once.
const parsed = new Map<string, Assignment>();
const CACHE_LIMIT = 32;

/** The assignment of settings given as JSON text (validated, as stored or read), parsed once. */
export function assignmentOfJson(settingsJson: string): Assignment {
  let assignment = parsed.get(settingsJson);
  if (!assignment) {
    assignment = parseAssignment(JSON.parse(settingsJson));
    if (parsed.size >= CACHE_LIMIT) parsed.clear();
    parsed.set(settingsJson, assignment);
  }
  return assignment;
}

/** Checks `submissions` against settings given as JSON text. */
export function checkSettingsBatch(input: { settingsJson: string; submissions: unknown[] }): CheckedSubmission[] {
  const assignment = assignmentOfJson(input.settingsJson);
  return input.submissions.map((submission) => checkAndRead(assignment, submission));
}
