import { readFileSync } from 'node:fs';
import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it, onTestFinished, vi } from 'vitest';
import { giveUpPassback } from '../../server/grading/grade-passback.ts';
import { call, submissionsFor, type Seed } from '../support/api-fixture.ts';
import { AGS_CLAIM } from '../support/lti-platform/ags-service.ts';
import { PLATFORM_ROLES, TestPlatform, type DeepLinkedItem, type PlatformUser } from '../support/lti-platform/test-platform.ts';
import { chooseToPlace, enterTool, launchTool, ticketOf } from '../support/lti-platform/tool-launch.ts';
import { openToolAndPlatform, type ToolAndPlatform } from '../support/lti-platform/tool-fixture.ts';
import type { TestDatabase } from '../support/test-database.ts';

/**
 * Grades sent by Assignment and Grade Services 2.0 to a test platform of our own making
 * (test/support/lti-platform), the whole way: an instructor deep-links an assignment, learners launch
 * the link, submit and read nothing before release, a TA releases, and the platform's gradebook holds
 * each released score as the student's own feedback shows it; an override released again replaces
 * it; the platform going down in the middle of a passback loses none. Section numbers are from memory
 * of the specifications. The tool is served on a real port: the platform checks our client assertions
 * against our key set as served.
 */
const LTI = 'https://purl.imsglobal.org/spec/lti/claim/';
// Invented people.
const instructor: PlatformUser = { sub: 'sub-ags-instructor', name: 'Ines Okafor', roles: PLATFORM_ROLES.instructor };
const learners: PlatformUser[] = Array.from({ length: 8 }, (_, i) => ({ sub: `sub-ags-learner-${i + 1}`, name: `Learner ${i + 1}`, roles: PLATFORM_ROLES.learner }));
const example = (name: string) => readFileSync(new URL(`../../docs/examples/${name}`, import.meta.url), 'utf8');
// The docs' worked example B-01 with run 1's k sign flipped, a slip a TA may override (docs/examples).
const B01 = (JSON.parse(example('submissions.json')) as Array<{ studentId?: string; runs: Array<{ reported: { k: { value: number } } }> }>)[0];
const withSlip = () => {
  const { studentId: _id, ...own } = structuredClone(B01);
  own.runs[0].reported.k.value = -own.runs[0].reported.k.value;
  return own;
};
const generated = submissionsFor(learners.map((l) => l.sub), 29).map(({ studentId: _id, ...own }) => own);

type Row = { studentId: string; submissionId: number | null; releasedScore: number | null; gradeSent: { state: string; reason: string | null } | null };
type Feedback = { score: number; maxScore: number };

describe('grades sent to a test platform by AGS 2.0', () => {
  let database: TestDatabase;
  let app: FastifyInstance;
  let platform: TestPlatform;
  let seed: Seed;
  let platformId: number;
  let link: DeepLinkedItem;
  const sessions = new Map<string, { cookie: string; 'x-csrf-token': string }>();

  let tool: ToolAndPlatform | undefined;

  beforeAll(async () => {
    // A passback that waits tries again after 1 s, doubling (30 s in service): an outage here lasts seconds.
    tool = await openToolAndPlatform({ served: true, config: { passbackRetrySeconds: 1 } });
    ({ database, app, platform, seed, platformId } = tool);
  }, 60_000);
  afterAll(() => tool?.close());

  const base = (sectionId = seed.sectionA.id, assignmentId = seed.assignment.id) => `/v1/sections/${sectionId}/assignments/${assignmentId}`;
  const results = async (sectionId?: number, assignmentId?: number) => (await call(app, 'GET', `${base(sectionId, assignmentId)}/results`, seed.instructorToken, undefined, 200)).body as Row[];
  const release = (token = seed.taAToken, sectionId?: number, assignmentId?: number) => call(app, 'POST', `${base(sectionId, assignmentId)}/release`, token, undefined, 200);
  /** Waits until every row of a platform's students shows the wanted send state. */
  const sendsSettle = (want: (rows: Row[]) => void, sectionId?: number, assignmentId?: number) =>
    vi.waitFor(async () => want((await results(sectionId, assignmentId)).filter((r) => r.gradeSent !== null)), { timeout: 45_000, interval: 250 });

  /** A learner launches the deep-linked link and signs in: their session and CSRF header. */
  async function launchLearner(user: PlatformUser, claims = platform.linkClaims(link)) {
    const launched = await launchTool(app, platform, user, { claims });
    expect(launched.statusCode, launched.body).toBe(200);
    const cookie = await enterTool(app, launched.body);
    const me = await app.inject({ method: 'GET', url: '/v1/student/me', headers: { cookie } });
    expect(me.statusCode, me.body).toBe(200);
    sessions.set(user.sub, { cookie, 'x-csrf-token': me.json().csrfToken });
  }
  const asLearner = (user: PlatformUser, method: 'GET' | 'POST', url: string, payload?: object) =>
    app.inject({ method, url, headers: sessions.get(user.sub)!, ...(payload ? { payload } : {}) });
  async function submit(user: PlatformUser, own: object, assignmentId = seed.assignment.id) {
    const res = await asLearner(user, 'POST', `/v1/student/assignments/${assignmentId}/submissions`, own);
    expect(res.statusCode, res.body).toBe(201);
  }
  async function feedbackOf(user: PlatformUser, assignmentId = seed.assignment.id): Promise<Feedback> {
    const res = await asLearner(user, 'GET', `/v1/student/assignments/${assignmentId}/feedback`);
    expect(res.statusCode, res.body).toBe(200);
    return res.json();
  }
  /** What the platform's gradebook holds for the deep-linked link's line item, by the platform's user id. */
  const held = () => platform.gradebook(link.lineItemId!);

  it("an instructor's deep link asks for a line item, which the platform makes and binds to the new link (Deep Linking 2.0, 3.x lineItem, from memory)", async () => {
    const choice = await launchTool(app, platform, instructor, { deepLinking: true });
    expect(choice.statusCode, choice.body).toBe(200);
    const answer = await chooseToPlace(app, ticketOf(choice.body), seed.assignment.id, seed.sectionA.id);
    expect(answer.statusCode, answer.body).toBe(200);
    const keySet = (await app.inject({ method: 'GET', url: '/v1/lti/jwks' })).json();
    link = await platform.receiveDeepLinkingResponse(/name="JWT" value="([^"]+)"/.exec(answer.body)![1], keySet);
    expect(link.lineItemId).toBeDefined();
    const item = platform.lineItems.find((i) => i.id === link.lineItemId)!;
    // AGS 2.0, line item: a label, a maximum above 0, our resource id and tag (docs/lti.md).
    expect(item).toMatchObject({ label: seed.assignment.title, scoreMaximum: 100, resourceId: `rateproof-assignment-${seed.assignment.id}`, tag: 'rateproof', resourceLinkId: link.resourceLinkId });
  });

  it('learners launch the link and submit; before a release they read nothing and the platform holds no score', async () => {
    for (const [i, user] of learners.slice(0, 3).entries()) {
      await launchLearner(user);
      await submit(user, i === 0 ? withSlip() : generated[i]);
    }
    for (const user of learners.slice(0, 3)) expect((await asLearner(user, 'GET', `/v1/student/assignments/${seed.assignment.id}/feedback`)).statusCode).toBe(404);
    await new Promise((resolve) => setTimeout(resolve, 1500));
    expect(held().size).toBe(0);
    expect(platform.scoreRequests).toBe(0);
    const rows = (await results()).filter((r) => r.submissionId !== null);
    expect(rows).toHaveLength(3);
    expect(rows.every((r) => r.gradeSent === null)).toBe(true);
  });

  it("a TA's release sends each released score; the platform holds what each student's own feedback shows (AGS 2.0, score service)", async () => {
    const before = Date.now();
    expect((await release()).body).toEqual({ released: 3, held: 0 });
    await sendsSettle((rows) => expect(rows.map((r) => r.gradeSent!.state)).toEqual(['sent', 'sent', 'sent']));
    const book = held();
    expect(book.size).toBe(3);
    for (const user of learners.slice(0, 3)) {
      const mine = await feedbackOf(user);
      const score = book.get(user.sub)!;
      // The fields: userId the platform's own id, the score and its maximum as released,
      // final progress values (AGS 2.0 enumerations), the release's time, a comment naming the feedback.
      expect(score).toMatchObject({ userId: user.sub, scoreGiven: mine.score, scoreMaximum: mine.maxScore, activityProgress: 'Completed', gradingProgress: 'FullyGraded' });
      expect(Date.parse(score.timestamp)).toBeGreaterThanOrEqual(before - 1000);
      expect(score.comment).toContain('http://localhost:80/student');
    }
    // The slip cost points: the score sent is below the maximum (a hand-worked verdict on B-01 with k's sign flipped).
    expect(book.get(learners[0].sub)!.scoreGiven).toBeLessThan(book.get(learners[0].sub)!.scoreMaximum!);
  });

  it('an override released again posts the new score, which the platform keeps as the later one', async () => {
    const row = (await results()).find((r) => r.releasedScore !== null && r.releasedScore < (held().get(learners[0].sub)!.scoreMaximum ?? 0))!;
    const detail = (await call(app, 'GET', `/v1/submissions/${row.submissionId}`, seed.taAToken, undefined, 200)).body;
    const slip = (detail.result.findings as Array<{ id: string; pointsLost: number }>).find((f) => f.pointsLost > 0)!;
    const was = held().get(learners[0].sub)!;
    await call(app, 'POST', `/v1/submissions/${row.submissionId}/overrides`, seed.taAToken, { findingId: slip.id, pointsLost: 0, reason: 'checked by hand' }, 201);
    // Nothing moves before the TA releases again.
    await new Promise((resolve) => setTimeout(resolve, 1500));
    expect(held().get(learners[0].sub)).toEqual(was);
    expect((await release()).body).toEqual({ released: 1, held: 0 });
    await vi.waitFor(() => expect(held().get(learners[0].sub)!.scoreGiven).toBe(was.scoreGiven! + slip.pointsLost), { timeout: 30_000, interval: 250 });
    expect(held().get(learners[0].sub)!.scoreGiven).toBe((await feedbackOf(learners[0])).score);
    expect(Date.parse(held().get(learners[0].sub)!.timestamp)).toBeGreaterThan(Date.parse(was.timestamp));
  });

  it('the platform goes down in the middle of a passback: the rest wait with the reason, and once it is back every score is there', async () => {
    for (const [i, user] of learners.slice(3).entries()) {
      await launchLearner(user);
      await submit(user, generated[i + 3]);
    }
    platform.failScoresAfter = 2;
    expect((await release()).body).toEqual({ released: 5, held: 0 });
    await sendsSettle((rows) => {
      const waiting = rows.filter((r) => r.gradeSent!.state === 'waiting');
      expect(waiting).toHaveLength(3);
      for (const r of waiting) expect(r.gradeSent!.reason).toBe('score service: status 503');
    });
    expect(held().size).toBe(5);
    platform.failScoresAfter = undefined;
    await sendsSettle((rows) => expect(rows.map((r) => r.gradeSent!.state)).toEqual(Array(8).fill('sent')));
    const book = held();
    expect([...book.keys()].sort()).toEqual(learners.map((l) => l.sub).sort());
    for (const user of learners) expect(book.get(user.sub)!.scoreGiven).toBe((await feedbackOf(user)).score);
  });

  it('a platform down for longer than the tries: the send waits, then is given up with the last reason; Send again sends it', async () => {
    const user = learners[1];
    // Down from here until given up (the token kept from before is still good: the score service answers first).
    platform.down = true;
    onTestFinished(() => void (platform.down = false));
    // A new version of the same work: released again, so sent again.
    await submit(user, generated[1]);
    expect((await release()).body).toEqual({ released: 1, held: 0 });
    const row = async () => (await results()).find((r) => r.gradeSent !== null && r.gradeSent.state !== 'sent');
    await vi.waitFor(async () => expect((await row())?.gradeSent).toMatchObject({ state: 'waiting', reason: 'score service: status 503' }), { timeout: 30_000, interval: 250 });
    // What the queue does once the tries are used up (8 of them, hours apart in service), done now.
    await giveUpPassback(database.store.db, { assignmentId: seed.assignment.id, sectionId: seed.sectionA.id });
    const given = (await row())!.gradeSent!;
    expect(given.state).toBe('failed');
    expect(given.reason).toMatch(/^gave up after (1 try|\d+ tries): score service: status 503$/);
    platform.down = false;
    expect((await call(app, 'POST', `${base()}/passback`, seed.taAToken, undefined, 200)).body).toEqual({ waiting: 1 });
    await sendsSettle((rows) => expect(rows.every((r) => r.gradeSent!.state === 'sent')).toBe(true));
    expect(held().get(user.sub)!.scoreGiven).toBe((await feedbackOf(user)).score);
  });

  it("a context that never offered the grade service fails with a reason; after a launch offers it, Send again finds no line item and makes one (AGS 2.0, line item service)", async () => {
    const second = (await call(app, 'POST', `/v1/courses/${seed.course.id}/assignments`, seed.instructorToken, { title: 'Iodination of acetone (invented)', settings: seed.settings }, 201)).body as { id: number; title: string };
    await call(app, 'PUT', `${base(seed.sectionB.id, second.id)}/lti-placement`, seed.instructorToken, { platformId, contextId: 'context-b', resourceLinkId: 'link-b' }, 200);
    const elsewhere = { [`${LTI}context`]: { id: 'context-b' }, [`${LTI}resource_link`]: { id: 'link-b' }, [AGS_CLAIM]: undefined };
    const user: PlatformUser = { sub: 'sub-ags-learner-b1', name: 'Learner B1', roles: PLATFORM_ROLES.learner };
    await launchLearner(user, elsewhere);
    await submit(user, generated[0], second.id);
    expect((await release(seed.taBToken, seed.sectionB.id, second.id)).body).toEqual({ released: 1, held: 0 });
    await sendsSettle((rows) => expect(rows.map((r) => [r.gradeSent!.state, r.gradeSent!.reason])).toEqual([['failed', expect.stringContaining('launch it from the course once')]]), seed.sectionB.id, second.id);
    // An instructor's launch from that context brings its line item container, and no line item of the link.
    const offered = { ...elsewhere, [AGS_CLAIM]: { scope: ['https://purl.imsglobal.org/spec/lti-ags/scope/lineitem', 'https://purl.imsglobal.org/spec/lti-ags/scope/score'], lineitems: platform.lineItems[0].id.replace(/\/\d+\?.*$/, '') } };
    expect((await launchTool(app, platform, instructor, { claims: offered })).statusCode).toBe(200);
    const items = platform.lineItems.length;
    expect((await call(app, 'POST', `${base(seed.sectionB.id, second.id)}/passback`, seed.taBToken, undefined, 200)).body).toEqual({ waiting: 1 });
    await sendsSettle((rows) => expect(rows.map((r) => [r.gradeSent!.state, r.gradeSent!.reason])).toEqual([['sent', null]]), seed.sectionB.id, second.id);
    expect(platform.lineItems).toHaveLength(items + 1);
    const made = platform.lineItems.at(-1)!;
    expect(made).toMatchObject({ label: second.title, scoreMaximum: 100, resourceId: `rateproof-assignment-${second.id}`, tag: 'rateproof' });
    expect(platform.gradebook(made.id).get(user.sub)!.scoreGiven).toBe((await feedbackOf(user, second.id)).score);
  });
});
