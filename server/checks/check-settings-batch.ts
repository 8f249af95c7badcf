import { checkAndRead, parseAssignment, type Assignment, type CheckedSubmission } from './check.ts';

// A worker is sent the same settings with every batch of an assignment: parse them once.
const parsed = new Map<string, Assignment>();
const CACHE_LIMIT = 32;

/** Checks `submissions` against settings given as JSON text (validated, as stored or read). */
export function checkSettingsBatch(input: { settingsJson: string; submissions: unknown[] }): CheckedSubmission[] {
  let assignment = parsed.get(input.settingsJson);
  if (!assignment) {
    assignment = parseAssignment(JSON.parse(input.settingsJson));
    if (parsed.size >= CACHE_LIMIT) parsed.clear();
    parsed.set(input.settingsJson, assignment);
  }
  return input.submissions.map((submission) => checkAndRead(assignment!, submission));
}
