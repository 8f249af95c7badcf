import type { Kysely } from 'kysely';
import type { CheckResult } from '../../schemas/result.ts';
import type { Database } from '../store/database.ts';
import type { GradedForStore } from '../batches/graded-for-store.ts';
import type { Grader } from './grader.ts';
import { pastDeadline } from '../store/deadlines.ts';
import { rosterRows } from '../store/students.ts';
import { storeGraded } from '../store/submissions.ts';
import { gradedWithLatePolicy, latePolicyOf, studentArrival } from './late-work.ts';

export interface BatchItem {
  /** Where the item came from: `[3]` in a JSON array, `line 12` in a CSV file. */
  at: string;
  submission: unknown;
}

export interface BatchOutcome {
  stored: Array<{ studentId: string; submissionId: number; version: number; status: CheckResult['status']; score: number | null; maxScore: number }>;
  rejected: Array<{ at: string; studentId: string | null; path: string; message: string }>;
}

/** A batch checked against an assignment's settings, before anything is stored. */
export interface GradedBatch {
  assignmentId: number;
  settings: unknown;
  settingsVersion: number;
  items: BatchItem[];
  graded: GradedForStore[];
}

/** Checks every submission of a batch (in the worker pool); no transaction is needed for this. */
export async function gradeBatch(grader: Grader, assignment: { id: number; settings: unknown; settingsVersion: number }, items: BatchItem[]): Promise<GradedBatch> {
  const graded = await grader.check(assignment.settings, items.map((item) => item.submission));
  return { assignmentId: assignment.id, settings: assignment.settings, settingsVersion: assignment.settingsVersion, items, graded };
}

type ToStore = { studentId: string; studentRowId: number; payloadJson: string; result: GradedForStore };

/**
 * Sorts a checked batch into what would be stored and what is refused: an invalid submission, or one
 * for a student not on the section's roster, is listed with the reason. Stores nothing.
 */
export async function screenBatch(db: Kysely<Database>, batch: GradedBatch, sectionId: number): Promise<{ toStore: ToStore[]; rejected: BatchOutcome['rejected'] }> {
  const { graded } = batch;
  const ids = graded.map((g) => g.studentId).filter((id): id is string => id !== null);
  const roster = await rosterRows(db, sectionId, [...new Set(ids)]);
  const rejected: BatchOutcome['rejected'] = [];
  const toStore: ToStore[] = [];
  batch.items.forEach((item, i) => {
    const result = graded[i];
    if (result.status === 'rejected') {
      for (const r of result.rejected) rejected.push({ at: item.at, studentId: result.studentId, path: r.path, message: r.message });
      return;
    }
    const row = roster.get(result.studentId!);
    if (row === undefined || row.status === 'removed') {
      rejected.push({ at: item.at, studentId: result.studentId, path: 'studentId', message: "not on this section's roster" });
      return;
    }
    if (row.status === 'withdrawn') {
      rejected.push({ at: item.at, studentId: result.studentId, path: 'studentId', message: 'withdrawn from this section; enrol them again to accept work' });
      return;
    }
    // Stored as the schema reads it: fields it does not know are left out, whatever they hold.
    toStore.push({ studentId: result.studentId!, studentRowId: row.id, payloadJson: result.payloadJson!, result });
  });
  return { toStore, rejected };
}

/**
 * Stores the valid submissions of a checked batch (a new version each, with its result) in the
 * caller's transaction. Staff uploads are on time by definition (see STAFF_UPLOAD), so no late-work
 * setting applies to them.
 */
export async function storeBatch(db: Kysely<Database>, batch: GradedBatch, args: { sectionId: number; staffId: number }): Promise<BatchOutcome> {
  const { toStore, rejected } = await screenBatch(db, batch, args.sectionId);
  const outcome: BatchOutcome = { stored: [], rejected };
  const stored = await storeGraded(db, batch.assignmentId, args.staffId, { settings: batch.settings, settingsVersion: batch.settingsVersion }, toStore);
  stored.forEach((s, i) => {
    const { studentId, result } = toStore[i];
    outcome.stored.push({ studentId, submissionId: s.submissionId, version: s.version, status: result.status, score: result.score, maxScore: result.maxScore });
  });
  return outcome;
}

/**
 * Stores a student's own submission, checked and valid, as their next version, in the caller's
 * transaction: late when stored past the section's deadline (the database's clock, as its stored
 * time), its result then under the assignment's late-work setting, and held when that holds late work.
 */
export async function storeOwnSubmission(db: Kysely<Database>, batch: GradedBatch, student: { studentRowId: number; sectionId: number }) {
  const [graded] = batch.graded;
  const isLate = await pastDeadline(db, batch.assignmentId, student.sectionId);
  const late = latePolicyOf(batch.settings);
  const arrival = studentArrival(isLate, late);
  const [stored] = await storeGraded(
    db,
    batch.assignmentId,
    null,
    { settings: batch.settings, settingsVersion: batch.settingsVersion },
    [{ studentRowId: student.studentRowId, payloadJson: graded.payloadJson!, result: gradedWithLatePolicy(graded, late, isLate) }],
    arrival,
  );
  return { ...stored, late: arrival.late, held: arrival.held };
}
