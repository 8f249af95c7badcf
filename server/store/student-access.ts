import { randomBytes, timingSafeEqual } from 'node:crypto';
import { sql, type Kysely } from 'kysely';
import type { Database } from './database.ts';
import { idKey } from './students.ts';
import { hashToken } from './tokens.ts';

/** A student signed in with their access code: they reach their own work in their own section, nothing else. */
export interface StudentCaller {
  kind: 'student';
  studentRowId: number;
  studentId: string;
  courseId: number;
  sectionId: number;
}

/** Session cookie values of students start with this, so one cookie serves both kinds of session. */
export const STUDENT_SESSION_PREFIX = 'st_';

/** Crockford's base32: 32 symbols without I, L, O or U, so a code read aloud or off paper is not misread. */
const CODE_ALPHABET = '0123456789ABCDEFGHJKMNPQRSTVWXYZ';
const CODE_LENGTH = 12;

/** A new code from node:crypto, grouped `XXXX-XXXX-XXXX` for reading; 256 is a multiple of 32, so `byte % 32` is uniform. */
export function newAccessCode(): string {
  const symbols = [...randomBytes(CODE_LENGTH)].map((b) => CODE_ALPHABET[b % 32]).join('');
  return symbols.match(/.{4}/g)!.join('-');
}

/** A code as typed: upper case, dashes and spaces dropped, the look-alikes O, I and L read as 0, 1 and 1. */
export function normaliseAccessCode(typed: string): string {
  return typed.toUpperCase().replace(/[\s-]/g, '').replace(/O/g, '0').replace(/[IL]/g, '1');
}

/** What is stored of a code: the SHA-256 of its normal form, as API tokens are kept. */
export const accessCodeHash = (typed: string): string => hashToken(normaliseAccessCode(typed));

/**
 * Issues a new code to each student row (revoking the live one first: a reissued code replaces the
 * old). Returns the plain codes by row id; they are shown once and never stored.
 */
export async function issueAccessCodes(db: Kysely<Database>, studentRowIds: number[], staffId: number): Promise<Map<number, string>> {
  if (studentRowIds.length === 0) return new Map();
  await revokeAccessCodes(db, studentRowIds);
  const codes = new Map(studentRowIds.map((id) => [id, newAccessCode()]));
  await db
    .insertInto('access_codes')
    .values([...codes].map(([id, code]) => ({ student_row_id: id, code_hash: accessCodeHash(code), issued_by: staffId })))
    .execute();
  return codes;
}

/** Revokes the live codes of these students and ends their sessions; returns how many codes were revoked. */
export async function revokeAccessCodes(db: Kysely<Database>, studentRowIds: number[]): Promise<number> {
  if (studentRowIds.length === 0) return 0;
  await endStudentSessionsOf(db, studentRowIds);
  const rows = await db
    .updateTable('access_codes')
    .set({ revoked_at: new Date() })
    .where('student_row_id', 'in', studentRowIds)
    .where('revoked_at', 'is', null)
    .returning('id')
    .execute();
  return rows.length;
}

/** The enrolled students of a section and when their live code was issued (null: none); never a code. */
export async function listAccessCodes(db: Kysely<Database>, sectionId: number) {
  return db
    .selectFrom('students')
    .leftJoin('access_codes', (join) => join.onRef('access_codes.student_row_id', '=', 'students.id').on('access_codes.revoked_at', 'is', null))
    .select(['students.student_id as studentId', 'students.display_name as displayName', 'access_codes.issued_at as issuedAt'])
    .where('students.section_id', '=', sectionId)
    .where('students.status', '=', 'enrolled')
    .orderBy('students.student_id')
    .execute();
}

/**
 * The roster students of a section a code may be issued to or revoked from: those named (matched
 * whatever their case), or every enrolled student when none are named.
 */
export async function codeHolders(db: Kysely<Database>, sectionId: number, studentIds?: string[]) {
  let query = db.selectFrom('students').select(['id', 'student_id as studentId', 'display_name as displayName', 'status']).where('section_id', '=', sectionId);
  query = studentIds === undefined ? query.where('status', '=', 'enrolled') : query.where(sql`lower(student_id)`, 'in', studentIds.map(idKey));
  return query.orderBy('student_id').execute();
}

const studentColumns = ['students.id as studentRowId', 'students.student_id as studentId', 'students.course_id as courseId', 'students.section_id as sectionId'] as const;

/** Two SHA-256 hex digests compared in constant time (both 32 bytes; anything else is no match). */
function sameHash(a: string, b: string): boolean {
  const [x, y] = [Buffer.from(a, 'hex'), Buffer.from(b, 'hex')];
  return x.length === 32 && y.length === 32 && timingSafeEqual(x, y);
}

const asCaller = (row: Omit<StudentCaller, 'kind'>): StudentCaller => ({ kind: 'student', ...row });

/**
 * The enrolled student whose live code this is. The row is found by the code's hash, and the hash
 * found is compared with the one computed in constant time, so the answer's timing says nothing of
 * how near a guess came; a wrong, revoked or withdrawn student's code is undefined alike.
 */
export async function studentOfCode(db: Kysely<Database>, typed: string): Promise<StudentCaller | undefined> {
  const hash = accessCodeHash(typed);
  const row = await db
    .selectFrom('access_codes')
    .innerJoin('students', 'students.id', 'access_codes.student_row_id')
    .select([...studentColumns, 'access_codes.code_hash as codeHash'])
    .where('access_codes.code_hash', '=', hash)
    .where('access_codes.revoked_at', 'is', null)
    .where('students.status', '=', 'enrolled')
    .executeTakeFirst();
  if (!row || !sameHash(row.codeHash, hash)) return undefined;
  const { codeHash: _, ...student } = row;
  return asCaller(student);
}

/** A new student session's cookie value (stored only as its hash, marked by its prefix) and when it expires. */
export async function createStudentSession(db: Kysely<Database>, studentRowId: number, hours: number): Promise<{ session: string; expiresAt: Date }> {
  const session = `${STUDENT_SESSION_PREFIX}${randomBytes(32).toString('base64url')}`;
  const expiresAt = new Date(Date.now() + hours * 3600_000);
  await db.insertInto('student_sessions').values({ student_row_id: studentRowId, session_hash: hashToken(session), expires_at: expiresAt }).execute();
  return { session, expiresAt };
}

/** The enrolled student behind a live student session. */
export async function studentSessionCaller(db: Kysely<Database>, session: string): Promise<StudentCaller | undefined> {
  const row = await db
    .selectFrom('student_sessions')
    .innerJoin('students', 'students.id', 'student_sessions.student_row_id')
    .select(studentColumns)
    .where('student_sessions.session_hash', '=', hashToken(session))
    .where('student_sessions.expires_at', '>', sql<Date>`now()`)
    .where('students.status', '=', 'enrolled')
    .executeTakeFirst();
  return row && asCaller(row);
}

/** Ends a student session (sign-out), and clears expired ones while at it. */
export async function endStudentSession(db: Kysely<Database>, session: string): Promise<void> {
  await db
    .deleteFrom('student_sessions')
    .where((eb) => eb.or([eb('session_hash', '=', hashToken(session)), eb('expires_at', '<=', sql<Date>`now()`)]))
    .execute();
}

/** Ends every session of these students (a code revoked, a student withdrawn or removed). */
export async function endStudentSessionsOf(db: Kysely<Database>, studentRowIds: number[]): Promise<void> {
  if (studentRowIds.length === 0) return;
  await db.deleteFrom('student_sessions').where('student_row_id', 'in', studentRowIds).execute();
}
