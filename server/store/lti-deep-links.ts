import { sql, type Kysely } from 'kysely';
import type { Database } from './database.ts';
import { hashToken } from './tokens.ts';

/** A deep linking request kept for the instructor's choice: what the answer to the platform needs. */
export interface PendingDeepLink {
  platformId: number;
  deploymentId: string;
  returnUrl: string;
  data: string | null;
}

export async function storeDeepLink(db: Kysely<Database>, ticket: string, link: PendingDeepLink, seconds: number): Promise<void> {
  await db.deleteFrom('lti_deep_links').where('expires_at', '<', sql<Date>`now()`).execute();
  await db
    .insertInto('lti_deep_links')
    .values({
      ticket_hash: hashToken(ticket),
      platform_id: link.platformId,
      deployment_id: link.deploymentId,
      return_url: link.returnUrl,
      data: link.data,
      expires_at: sql<Date>`now() + make_interval(secs => ${seconds})`,
    })
    .execute();
}

/** A live deep linking request, taken (deleted in the same statement: single use). */
export async function takeDeepLink(db: Kysely<Database>, ticket: string): Promise<PendingDeepLink | undefined> {
  return db
    .deleteFrom('lti_deep_links')
    .where('ticket_hash', '=', hashToken(ticket))
    .where('expires_at', '>', sql<Date>`now()`)
    .returning(['platform_id as platformId', 'deployment_id as deploymentId', 'return_url as returnUrl', 'data'])
    .executeTakeFirst();
}
