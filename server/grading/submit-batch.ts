import type { Kysely } from 'kysely';
import type { CheckResult } from '../../schemas/result.ts';
import type { Database } from '../store/database.ts';
import type { Grader } from './grader.ts';
import { rosterRows } from '../store/students.ts';
import { storeGraded } from '../store/submissions.ts';

export interface BatchItem {
  /** Where the item came from: `[3]` in a JSON array, `line 12` in a CSV file. */
  at: string;
  submission: unknown;
}

export interface BatchOutcome {
  stored: Array<{ studentId: string; submissionId: number; version: number; status: CheckResult['status']; score: number | null; maxScore: number }>;
  rejected: Array<{ at: string; studentId: string | null; path: string; message: string }>;
}

/**
 * Grades every submission of a batch and stores the valid ones (a new version each, with its result)
 * in the caller's transaction. An invalid submission, or one for a student not on the section's
 * roster, is listed with the reason and stored nowhere.
 */
export async function submitBatch(
  db: Kysely<Database>,
  grader: Grader,
  args: { assignmentId: number; settingsVersion: number; settings: unknown; sectionId: number; staffId: number; items: BatchItem[] },
): Promise<BatchOutcome> {
  const checked = await grader.check(args.settings, args.items.map((item) => item.submission));
  const graded = args.items.map((item, i) => ({ item, ...checked[i] }));
  const ids = graded.map((g) => g.result.studentId).filter((id): id is string => id !== null);
  const roster = await rosterRows(db, args.sectionId, [...new Set(ids)]);
  const outcome: BatchOutcome = { stored: [], rejected: [] };
  const toStore: Array<{ studentId: string; studentRowId: number; payload: unknown; result: CheckResult }> = [];
  for (const { item, result, read } of graded) {
    if (result.status === 'rejected') {
      for (const r of result.rejected ?? []) outcome.rejected.push({ at: item.at, studentId: result.studentId, path: r.path, message: r.message });
      continue;
    }
    const row = roster.get(result.studentId!);
    if (row === undefined) {
      outcome.rejected.push({ at: item.at, studentId: result.studentId, path: 'studentId', message: "not on this section's roster" });
      continue;
    }
    // Stored as the schema reads it: fields it does not know are left out, whatever they hold.
    toStore.push({ studentId: result.studentId!, studentRowId: row, payload: read, result });
  }
  const stored = await storeGraded(
    db,
    args.assignmentId,
    args.staffId,
    toStore.map((s) => ({ studentRowId: s.studentRowId, payload: s.payload, result: s.result, settings: args.settings, settingsVersion: args.settingsVersion })),
  );
  stored.forEach((s, i) => {
    const { studentId, result } = toStore[i];
    outcome.stored.push({ studentId, submissionId: s.submissionId, version: s.version, status: result.status, score: result.score, maxScore: result.maxScore });
  });
  return outcome;
}
