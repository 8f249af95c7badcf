import type { Kysely } from 'kysely';
import type { AssignmentRow } from '../store/assignments.ts';
import type { Database } from '../store/database.ts';
import { insertResults, latestSubmissions } from '../store/submissions.ts';
import { assignmentOf } from './assignment-of.ts';
import type { Grader } from './grader.ts';

/** New results for the latest submissions under the current settings; earlier results stay. */
export async function regrade(db: Kysely<Database>, grader: Grader, assignment: AssignmentRow, sectionId?: number): Promise<number> {
  assignmentOf(assignment.settings, 'settings');
  const latest = await latestSubmissions(db, assignment.id, sectionId);
  const graded = await grader.check(assignment.settings, latest.map((s) => s.payload));
  await insertResults(
    db,
    { settings: assignment.settings, settingsVersion: assignment.settingsVersion },
    latest.map((s, i) => ({ submissionId: s.submissionId, result: graded[i] })),
  );
  return latest.length;
}
