import { createHash, randomBytes } from 'node:crypto';
import type { Kysely } from 'kysely';
import type { Database } from './database.ts';

/** Tokens are random and stored only as SHA-256 hashes; the plain token is shown once, at creation. */
export function hashToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}

export async function createToken(db: Kysely<Database>, staffId: number): Promise<string> {
  const token = `rp_${randomBytes(32).toString('base64url')}`;
  await db.insertInto('api_tokens').values({ staff_id: staffId, token_hash: hashToken(token), revoked_at: null }).execute();
  return token;
}

/** Revokes every live token of a staff member (someone leaves the course, a token leaks), and ends their browser sessions. */
export async function revokeTokens(db: Kysely<Database>, staffId: number): Promise<number> {
  await db.deleteFrom('sessions').where('staff_id', '=', staffId).execute();
  const rows = await db
    .updateTable('api_tokens')
    .set({ revoked_at: new Date() })
    .where('staff_id', '=', staffId)
    .where('revoked_at', 'is', null)
    .returning('id')
    .execute();
  return rows.length;
}

export interface StaffCaller {
  kind: 'staff';
  staffId: number;
  courseId: number;
  role: 'instructor' | 'ta';
  /** Sections a TA is assigned to; an instructor sees every section of the course. */
  sectionIds: number[];
}

/** A staff member as a caller, with the sections a TA is assigned to. */
export async function staffCaller(db: Kysely<Database>, row: { staffId: number; courseId: number; role: 'instructor' | 'ta' }): Promise<StaffCaller> {
  const sections = await db.selectFrom('ta_sections').select('section_id').where('staff_id', '=', row.staffId).execute();
  return { kind: 'staff', staffId: row.staffId, courseId: row.courseId, role: row.role, sectionIds: sections.map((s) => s.section_id) };
}

export async function findCaller(db: Kysely<Database>, token: string): Promise<StaffCaller | undefined> {
  const row = await db
    .selectFrom('api_tokens')
    .innerJoin('staff', 'staff.id', 'api_tokens.staff_id')
    .select(['staff.id as staffId', 'staff.course_id as courseId', 'staff.role as role'])
    .where('api_tokens.token_hash', '=', hashToken(token))
    .where('api_tokens.revoked_at', 'is', null)
    .executeTakeFirst();
  return row && staffCaller(db, row);
}
