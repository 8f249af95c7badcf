import type { Kysely } from 'kysely';
import { checkSubmission } from '../checks/check.ts';
import type { AssignmentRow } from '../store/assignments.ts';
import type { Database } from '../store/database.ts';
import { insertResults, latestSubmissions } from '../store/submissions.ts';
import { assignmentOf } from './assignment-of.ts';

/** New results for the latest submissions under the current settings; earlier results stay. */
export async function regrade(db: Kysely<Database>, assignment: AssignmentRow, sectionId?: number): Promise<number> {
  const checker = assignmentOf(assignment.settings, 'settings');
  const latest = await latestSubmissions(db, assignment.id, sectionId);
  await insertResults(
    db,
    latest.map((s) => ({
      submissionId: s.submissionId,
      result: checkSubmission(checker, s.payload),
      settings: assignment.settings,
      settingsVersion: assignment.settingsVersion,
    })),
  );
  return latest.length;
}
