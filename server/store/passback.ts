import type { Kysely } from 'kysely';
import type { Database } from './database.ts';

/** One student's grade as passback would send it. */
export interface PassbackGrade {
  studentId: string;
  score: number | null;
  maxScore: number;
  releasedAt: string;
}

/** Keeps what passback would send for a section's assignment (no platform is connected yet). */
export async function recordPassback(db: Kysely<Database>, assignmentId: number, sectionId: number, grades: PassbackGrade[]): Promise<void> {
  await db.insertInto('passback_records').values({ assignment_id: assignmentId, section_id: sectionId, grades: JSON.stringify(grades) }).execute();
}

export async function passbackRecords(db: Kysely<Database>, assignmentId: number, sectionId: number) {
  return db
    .selectFrom('passback_records')
    .select(['id', 'grades', 'recorded_at as recordedAt'])
    .where('assignment_id', '=', assignmentId)
    .where('section_id', '=', sectionId)
    .orderBy('id')
    .execute();
}
