import { z } from 'zod';
import { askPlatform as ask, platformFailed } from './service-token.ts';

/** AGS 2.0 media types: a line item, a container of them, a score. */
const LINE_ITEM_TYPE = 'application/vnd.ims.lis.v2.lineitem+json';
const CONTAINER_TYPE = 'application/vnd.ims.lis.v2.lineitemcontainer+json';
const SCORE_TYPE = 'application/vnd.ims.lis.v1.score+json';

/**
 * The line items an assignment's scores go to carry this resource id and tag, in line items this
 * tool makes and in the line item of a deep-linked resource link, so that either is found again.
 */
export const resourceIdOf = (assignmentId: number) => `rateproof-assignment-${assignmentId}`;
export const LINE_ITEM_TAG = 'rateproof';
/**
 * A line item's maximum: each score carries its own maximum and the platform scales it to the line
 * item's (AGS 2.0, score service, from memory), so a line item out of 100 reads as a percentage.
 */
export const LINE_ITEM_MAXIMUM = 100;

const LineItem = z.object({ id: z.url() });

/** The line item an assignment makes in a context's container, or asks for in a deep link. */
export function lineItemFor(assignment: { id: number; title: string }) {
  return { scoreMaximum: LINE_ITEM_MAXIMUM, label: assignment.title.slice(0, 200), resourceId: resourceIdOf(assignment.id), tag: LINE_ITEM_TAG };
}

/**
 * The URL of the assignment's line item in a context (AGS 2.0, line item service): the one in the
 * container with the assignment's resource id (the `resource_id` filter), else one made there.
 */
export async function findOrMakeLineItem(containerUrl: string, token: string, assignment: { id: number; title: string }): Promise<string> {
  const search = new URL(containerUrl);
  search.searchParams.set('resource_id', resourceIdOf(assignment.id));
  const listed = await ask('line item service', search.toString(), { headers: { accept: CONTAINER_TYPE, authorization: `Bearer ${token}` } });
  const found = z.array(LineItem).safeParse(await listed.json().catch(() => undefined));
  if (!found.success) throw platformFailed('line item service', 'not a line item container', true);
  if (found.data.length > 0) return found.data[0].id;
  const made = await ask('line item service', containerUrl, {
    method: 'POST',
    headers: { 'content-type': LINE_ITEM_TYPE, accept: LINE_ITEM_TYPE, authorization: `Bearer ${token}` },
    body: JSON.stringify(lineItemFor(assignment)),
  });
  const item = LineItem.safeParse(await made.json().catch(() => undefined));
  if (!item.success) throw platformFailed('line item service', 'not a line item', true);
  return item.data.id;
}

/** A score as AGS 2.0's score service takes it: final, fully graded, stamped with its release. */
export interface Score {
  userId: string;
  scoreGiven: number;
  scoreMaximum: number;
  comment: string;
  timestamp: string;
}

/** The scores URL of a line item: its path with `/scores` added, any query kept (AGS 2.0, score service). */
export function scoresUrl(lineItemUrl: string): string {
  const url = new URL(lineItemUrl);
  url.pathname = `${url.pathname.replace(/\/$/, '')}/scores`;
  return url.toString();
}

/** Posts one score to a line item; the platform keeps the one with the latest timestamp. */
export async function postScore(lineItemUrl: string, token: string, score: Score): Promise<void> {
  await ask('score service', scoresUrl(lineItemUrl), {
    method: 'POST',
    headers: { 'content-type': SCORE_TYPE, authorization: `Bearer ${token}` },
    body: JSON.stringify({ ...score, activityProgress: 'Completed', gradingProgress: 'FullyGraded' }),
  });
}
