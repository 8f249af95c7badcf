import { sql, type Kysely } from 'kysely';
import type { Database, GradeSendState } from './database.ts';

/** One waiting send as the passback job reads it: whom to send for, and which release generation. */
export interface WaitingSend {
  studentRowId: number;
  studentId: string;
  sub: string;
  platformId: number;
  generation: number;
}

/** A send the job tried: the row and the generation it read, so a newer release is never marked. */
export type TriedSend = Pick<WaitingSend, 'studentRowId' | 'generation'>;

/**
 * Marks waiting the sends of the students whose submissions were just released, in the release's
 * transaction: those a platform knows (they came by a launch or a roster pull) and whose section has
 * a resource link of that platform placed for the assignment. A send already there waits again for
 * the new release. Returns how many wait.
 */
export async function markReleasedForSending(db: Kysely<Database>, assignmentId: number, submissionIds: number[]): Promise<number> {
  if (submissionIds.length === 0) return 0;
  const { rows } = await sql<{ student_row_id: number }>`
    insert into grade_sends (assignment_id, student_row_id, platform_id, state)
    select distinct on (sub.student_row_id) ${assignmentId}::integer, sub.student_row_id, u.platform_id, 'waiting'
    from submissions sub
    join students st on st.id = sub.student_row_id
    join lti_users u on u.student_row_id = sub.student_row_id
    where sub.id = any(${submissionIds}::integer[]) and sub.assignment_id = ${assignmentId}
      and exists (select 1 from lti_placements p where p.platform_id = u.platform_id and p.assignment_id = ${assignmentId} and p.section_id = st.section_id)
    order by sub.student_row_id, u.platform_id
    on conflict (assignment_id, student_row_id) do update
      set state = 'waiting', reason = null, tries = 0, platform_id = excluded.platform_id, generation = grade_sends.generation + 1, queued_at = now()
    returning student_row_id`.execute(db);
  return rows.length;
}

/** The sends of a section's assignment still waiting, with the platform's subject id of each student. */
export async function waitingSends(db: Kysely<Database>, assignmentId: number, sectionId: number): Promise<WaitingSend[]> {
  return db
    .selectFrom('grade_sends as g')
    .innerJoin('students as st', 'st.id', 'g.student_row_id')
    .innerJoin('lti_users as u', (join) => join.onRef('u.student_row_id', '=', 'g.student_row_id').onRef('u.platform_id', '=', 'g.platform_id'))
    .select(['g.student_row_id as studentRowId', 'st.student_id as studentId', 'u.sub as sub', 'g.platform_id as platformId', 'g.generation as generation'])
    .where('g.assignment_id', '=', assignmentId)
    .where('st.section_id', '=', sectionId)
    .where('g.state', '=', 'waiting')
    .orderBy('st.student_id')
    .execute();
}

/** A try's update of one send, counted, if no newer release has made it wait again since it was read. */
function updateTried(db: Kysely<Database>, assignmentId: number, send: TriedSend) {
  return db
    .updateTable('grade_sends')
    .set((eb) => ({ tries: eb('tries', '+', 1) }))
    .where('assignment_id', '=', assignmentId)
    .where('student_row_id', '=', send.studentRowId)
    .where('generation', '=', send.generation)
    .where('state', '=', 'waiting');
}

/** Records a send's outcome. */
export async function settleSend(db: Kysely<Database>, assignmentId: number, send: TriedSend, outcome: { state: 'sent'; score: number } | { state: 'failed'; reason: string }): Promise<void> {
  await updateTried(db, assignmentId, send)
    .set(outcome.state === 'sent' ? { state: 'sent', sent_at: sql<Date>`now()`, sent_score: outcome.score, reason: null } : { state: 'failed', reason: outcome.reason })
    .execute();
}

/** Keeps the reason a try failed on sends that stay waiting, to be tried again. */
export async function noteFailedTry(db: Kysely<Database>, assignmentId: number, sends: TriedSend[], reason: string): Promise<void> {
  for (const send of sends) await updateTried(db, assignmentId, send).set({ reason }).execute();
}

/** Gives up the sends of a section's assignment still waiting once the job's tries are used up, keeping the last reason. */
export async function giveUpSends(db: Kysely<Database>, assignmentId: number, sectionId: number): Promise<void> {
  await db
    .updateTable('grade_sends')
    .set({ state: 'failed', reason: sql<string>`'gave up after ' || tries || CASE WHEN tries = 1 THEN ' try: ' ELSE ' tries: ' END || coalesce(reason, 'no answer')` })
    .where('assignment_id', '=', assignmentId)
    .where('state', '=', 'waiting')
    .where('student_row_id', 'in', (eb) => eb.selectFrom('students').select('id').where('section_id', '=', sectionId))
    .execute();
}

/** Makes the failed sends of a section's assignment wait again (a TA's "send again"); returns how many. */
export async function retryFailedSends(db: Kysely<Database>, assignmentId: number, sectionId: number): Promise<number> {
  const rows = await db
    .updateTable('grade_sends')
    .set((eb) => ({ state: 'waiting', reason: null, tries: 0, generation: eb('generation', '+', 1), queued_at: sql<Date>`now()` }))
    .where('assignment_id', '=', assignmentId)
    .where('state', '=', 'failed')
    .where('student_row_id', 'in', (eb) => eb.selectFrom('students').select('id').where('section_id', '=', sectionId))
    .returning('student_row_id')
    .execute();
  return rows.length;
}

/** Where each student's grade send stands for a section's assignment, by student id (students a platform does not know have none). */
export async function gradeSendsOfSection(db: Kysely<Database>, assignmentId: number, sectionId: number): Promise<Map<string, { state: GradeSendState; reason: string | null; at: Date }>> {
  const rows = await db
    .selectFrom('grade_sends as g')
    .innerJoin('students as st', 'st.id', 'g.student_row_id')
    .select(['st.student_id as studentId', 'g.state as state', 'g.reason as reason', 'g.sent_at as sentAt', 'g.queued_at as queuedAt'])
    .where('g.assignment_id', '=', assignmentId)
    .where('st.section_id', '=', sectionId)
    .execute();
  return new Map(rows.map((r) => [r.studentId, { state: r.state, reason: r.reason, at: r.sentAt ?? r.queuedAt }]));
}

/** A platform context placed for an assignment's section, with what it offered of its grade services. */
export async function gradeContexts(db: Kysely<Database>, assignmentId: number, sectionId: number) {
  return db
    .selectFrom('lti_placements as p')
    .leftJoin('lti_contexts as c', (join) => join.onRef('c.platform_id', '=', 'p.platform_id').onRef('c.context_id', '=', 'p.context_id'))
    .leftJoin('lti_line_items as li', (join) => join.onRef('li.platform_id', '=', 'p.platform_id').onRef('li.context_id', '=', 'p.context_id').on('li.assignment_id', '=', assignmentId))
    .select(['p.platform_id as platformId', 'p.context_id as contextId', 'c.line_items_url as lineItemsUrl', 'li.url as lineItemUrl'])
    .where('p.assignment_id', '=', assignmentId)
    .where('p.section_id', '=', sectionId)
    .orderBy('p.placed_at')
    .execute();
}
