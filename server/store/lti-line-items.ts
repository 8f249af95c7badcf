import type { Kysely } from 'kysely';
import type { Database } from './database.ts';

/** Where an assignment's scores go in one platform context (AGS 2.0). */
export interface LineItemPlace {
  platformId: number;
  contextId: string;
  assignmentId: number;
}

/** Keeps the line item an assignment's scores go to in a context: the latest one bound or made wins. */
export async function storeLineItem(db: Kysely<Database>, p: LineItemPlace & { url: string }): Promise<void> {
  await db
    .insertInto('lti_line_items')
    .values({ platform_id: p.platformId, context_id: p.contextId, assignment_id: p.assignmentId, url: p.url })
    .onConflict((oc) => oc.columns(['platform_id', 'context_id', 'assignment_id']).doUpdateSet({ url: p.url }))
    .execute();
}

export async function lineItemOf(db: Kysely<Database>, p: LineItemPlace): Promise<string | undefined> {
  const row = await db
    .selectFrom('lti_line_items')
    .select('url')
    .where('platform_id', '=', p.platformId)
    .where('context_id', '=', p.contextId)
    .where('assignment_id', '=', p.assignmentId)
    .executeTakeFirst();
  return row?.url;
}
