import type { Kysely } from 'kysely';
import { AGS_SCOPES } from '../lti/claims.ts';
import { findOrMakeLineItem, postScore } from '../lti/grade-service.ts';
import { forgetServiceTokens, PlatformFailure, serviceToken } from '../lti/service-token.ts';
import { getAssignment } from '../store/assignments.ts';
import type { Database } from '../store/database.ts';
import { gradeContexts, giveUpSends, noteFailedTry, settleSend, waitingSends, type WaitingSend } from '../store/grade-sends.ts';
import { storeLineItem } from '../store/lti-line-items.ts';
import { getPlatform } from '../store/lti-platforms.ts';
import { sectionStandings } from './report-inputs.ts';

/** Grades released in a section, to be sent to the learning platforms its students came from. */
export interface PassbackJob {
  assignmentId: number;
  sectionId: number;
  /** Where a student reads their feedback, for the score's comment (the releasing request's origin). */
  feedbackUrl?: string;
}

/** Thrown when some sends are to be tried again later: the job queue's retry and backoff do the waiting. */
export class PassbackWaits extends Error {
  override readonly name = 'PassbackWaits';
}

type Released = { score: number | null; maxScore: number; releasedAt: Date };

/**
 * Sends each waiting student's released score to their platform's line item for the assignment (AGS
 * 2.0): a token for the line item and score scopes, the line item (kept from a launch, found by its
 * resource id, or made), then one score per student, each marked sent as soon as the platform takes
 * it. A platform that is down leaves the rest waiting with the reason, and the job is tried again; a
 * score the platform refuses, or a context that never offered its grade service, fails with the reason
 * and is not tried again until a TA sends it again. Nothing is held in a transaction while the platform answers.
 */
export async function sendReleasedGrades(db: Kysely<Database>, job: PassbackJob): Promise<void> {
  const waiting = await waitingSends(db, job.assignmentId, job.sectionId);
  if (waiting.length === 0) return;
  const standings = await sectionStandings(db, job.sectionId, job.assignmentId);
  const released = new Map(standings.flatMap((row): [string, Released][] => (row.released?.releasedAt ? [[row.studentId, { score: row.released.score, maxScore: row.released.maxScore, releasedAt: row.released.releasedAt }]] : [])));
  const reasons: string[] = [];
  for (const platformId of new Set(waiting.map((w) => w.platformId))) {
    const sends = waiting.filter((w) => w.platformId === platformId);
    const left = await sendToPlatform(db, job, platformId, sends, released);
    if (left !== undefined) reasons.push(left);
  }
  if (reasons.length > 0) throw new PassbackWaits(`grades wait to be sent: ${reasons.join('; ')}`);
}

/** Sends one platform's waiting scores; the reason some still wait, if any do. */
async function sendToPlatform(db: Kysely<Database>, job: PassbackJob, platformId: number, sends: WaitingSend[], released: Map<string, Released>): Promise<string | undefined> {
  const fail = (send: WaitingSend, reason: string) => settleSend(db, job.assignmentId, send, { state: 'failed', reason });
  const platform = await getPlatform(db, platformId);
  const context = (await gradeContexts(db, job.assignmentId, job.sectionId)).find((c) => c.platformId === platformId && (c.lineItemUrl !== null || c.lineItemsUrl !== null));
  if (!platform || !context) {
    for (const send of sends) await fail(send, "the platform has not offered its grade service for this activity: launch it from the course once, then send again");
    return undefined;
  }
  let done = 0;
  try {
    const token = await serviceToken(db, platform, [AGS_SCOPES.lineItem, AGS_SCOPES.score]);
    let lineItemUrl = context.lineItemUrl;
    if (lineItemUrl === null) {
      const assignment = (await getAssignment(db, job.assignmentId))!;
      lineItemUrl = await findOrMakeLineItem(context.lineItemsUrl!, token, { id: assignment.id, title: assignment.title });
      await storeLineItem(db, { platformId, contextId: context.contextId, assignmentId: job.assignmentId, url: lineItemUrl });
    }
    for (const send of sends) {
      const grade = released.get(send.studentId);
      if (grade?.score === null || grade === undefined) {
        await fail(send, grade ? 'the released result has no score' : 'nothing is released for this student');
      } else {
        try {
          await postScore(lineItemUrl, token, { userId: send.sub, scoreGiven: grade.score, scoreMaximum: grade.maxScore, comment: feedbackComment(job.feedbackUrl), timestamp: grade.releasedAt.toISOString() });
          await settleSend(db, job.assignmentId, send, { state: 'sent', score: grade.score });
        } catch (error) {
          // A score refused as such fails alone; the platform being down stops the rest.
          if (!(error instanceof PlatformFailure) || !error.lasting) throw error;
          await fail(send, `${error.step}: ${error.why}`);
        }
      }
      done++;
    }
    return undefined;
  } catch (error) {
    if (!(error instanceof PlatformFailure)) throw error;
    const reason = `${error.step}: ${error.why}`;
    const rest = sends.slice(done);
    if (error.lasting) {
      for (const send of rest) await fail(send, reason);
      return undefined;
    }
    // A token the platform no longer takes is asked for again on the next try.
    if (error.why === 'status 401') forgetServiceTokens(platformId);
    await noteFailedTry(db, job.assignmentId, rest, reason);
    return reason;
  }
}

function feedbackComment(feedbackUrl: string | undefined): string {
  const where = feedbackUrl ? ` at ${feedbackUrl}` : '';
  return `Feedback on this work is in Rateproof${where}; open the activity from the course to read it.`;
}

/** When the job's tries are used up: the sends still waiting fail, with the last reason. */
export async function giveUpPassback(db: Kysely<Database>, job: PassbackJob): Promise<void> {
  await giveUpSends(db, job.assignmentId, job.sectionId);
}
