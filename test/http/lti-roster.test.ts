import type { FastifyInstance } from 'fastify';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { nextPage } from '../../server/lti/memberships.ts';
import { call, type Seed } from '../support/api-fixture.ts';
import { PLATFORM_ROLES, TestPlatform, type ContextMember, type PlatformUser } from '../support/lti-platform/test-platform.ts';
import { launchTool } from '../support/lti-platform/tool-launch.ts';
import { openToolAndPlatform, placeOnSectionA, type ToolAndPlatform } from '../support/lti-platform/tool-fixture.ts';

/**
 * Rosters pulled from a test platform's membership service (NRPS 2.0), with the service token asked
 * by the client credentials grant (Security Framework 1.0, 4.1). Section numbers are from memory of
 * the specifications (not confirmed here against the documents). The tool is served on a real port
 * so that the platform checks our client assertions against our key set as served, with jose.
 */

// Invented people.
const instructor: PlatformUser = { sub: 'sub-instructor-r1', name: 'Ines Calloway', roles: PLATFORM_ROLES.instructor };
const learner = (n: number, status?: ContextMember['status']): ContextMember => ({ user_id: `sub-learner-r${n}`, name: `Learner ${n}`, roles: PLATFORM_ROLES.learner, ...(status ? { status } : {}) });
const staffMembers: ContextMember[] = [
  { user_id: instructor.sub, name: instructor.name, roles: PLATFORM_ROLES.instructor },
  { user_id: 'sub-ta-r1', name: 'Tam Ferro', roles: PLATFORM_ROLES.ta },
];

describe('roster pull by NRPS 2.0 from a test platform', () => {
  let app: FastifyInstance;
  let platform: TestPlatform;
  let seed: Seed;
  let pullUrl: string;
  let tool: ToolAndPlatform | undefined;

  beforeAll(async () => {
    tool = await openToolAndPlatform({ served: true });
    ({ app, platform, seed } = tool);
    await placeOnSectionA(app, seed, platform, tool.platformId);
    pullUrl = `/v1/sections/${seed.sectionA.id}/roster/pull`;
  }, 60_000);
  afterAll(() => tool?.close());

  /** A whole launch (Security Framework 1.0, 5.1.1), its id_token carrying the NRPS claim as every launch of this platform does. */
  async function launch(user: PlatformUser) {
    const launched = await launchTool(app, platform, user);
    expect(launched.statusCode, launched.body).toBe(200);
  }

  const roster = async () => (await call(app, 'GET', `/v1/sections/${seed.sectionA.id}/roster`, seed.instructorToken, undefined, 200)).body as Array<{ studentId: string; displayName: string | null; status: string; history: Array<{ status: string; by: string | null }> }>;
  const byName = async (name: string) => (await roster()).find((s) => s.displayName === name);

  it("answers 409 until a staff launch has sent the context's membership URL; a learner's launch does not keep it", async () => {
    await launch({ sub: 'sub-learner-r1', name: 'Learner 1', roles: PLATFORM_ROLES.learner });
    const before = await call(app, 'POST', pullUrl, seed.instructorToken, undefined, 409);
    expect(before.body.error.message).toContain('membership service');
    await launch(instructor);
  });

  it('a platform that is down answers 502 platform-unavailable naming the token step, and nothing is stored', async () => {
    platform.members.push(...staffMembers, learner(1), learner(2), learner(3));
    const rosterBefore = await roster();
    platform.down = true;
    const res = await call(app, 'POST', pullUrl, seed.instructorToken, undefined, 502);
    platform.down = false;
    expect(res.body.error.code).toBe('platform-unavailable');
    expect(res.body.error.message).toContain('token endpoint');
    expect(await roster()).toEqual(rosterBefore);
  });

  it('enrols the active learners, not staff, following every page; the assertion passes the platform checks (NRPS 2.0; Security Framework 4.1)', async () => {
    // 5 members, 2 to a page: three pages, the last two named by Link rel="next" (NRPS 2.0, paging).
    const res = await call(app, 'POST', pullUrl, seed.instructorToken, undefined, 200);
    // Learner 1 launched already (made then, counted unchanged); learners 2 and 3 are new.
    expect(res.body).toEqual({ enrolled: 2, withdrawn: 0, unchanged: 1 });
    const after = await roster();
    const fromPlatform = after.filter((s) => s.studentId.startsWith('lti-'));
    expect(fromPlatform.map((s) => s.displayName).sort()).toEqual(['Learner 1', 'Learner 2', 'Learner 3']);
    expect(fromPlatform.every((s) => s.status === 'enrolled' && /^lti-\d+$/.test(s.studentId))).toBe(true);
    // The history says who enrolled them: nobody for the launch, the instructor for the pull (the seed's handle).
    expect((await byName('Learner 1'))?.history.map((h) => h.by)).toEqual([null]);
    expect((await byName('Learner 2'))?.history.map((h) => h.by)).toEqual(['instructor-1']);
    // The platform's subject ids are never the student ids (docs/lti.md, data protection).
    expect(JSON.stringify(after)).not.toContain('sub-learner');
    // Students added by hand stay as they were (the seed's six).
    expect(after.filter((s) => s.studentId.startsWith('S-')).every((s) => s.status === 'enrolled')).toBe(true);
    // The platform verified the assertion (issueToken throws otherwise) and kept its claims: RFC 7523 / Security Framework 4.1.
    expect(platform.tokenRequests).toBe(1);
    const [claims] = platform.assertions;
    expect(claims).toMatchObject({ iss: platform.clientId, sub: platform.clientId, aud: `${platform.base}/token` });
    expect(typeof claims.jti).toBe('string');
    expect((claims.exp as number) - (claims.iat as number)).toBe(300);
  });

  it('a second pull withdraws the learner dropped and the one listed Inactive, keeping history; the token is reused', async () => {
    platform.members.splice(0, platform.members.length, ...staffMembers, learner(1), learner(3, 'Inactive'));
    const res = await call(app, 'POST', pullUrl, seed.instructorToken, undefined, 200);
    expect(res.body).toEqual({ enrolled: 0, withdrawn: 2, unchanged: 1 });
    for (const name of ['Learner 2', 'Learner 3']) {
      const student = await byName(name);
      expect(student?.status).toBe('withdrawn');
      expect(student?.history.map((h) => h.status)).toEqual(['enrolled', 'withdrawn']);
    }
    expect((await byName('Learner 1'))?.status).toBe('enrolled');
    // Cached until shortly before expires_in (3600 s here): no second token request.
    expect(platform.tokenRequests).toBe(1);
  });

  it('a page failing part way stores nothing; once it answers, the learner listed again is enrolled again', async () => {
    platform.members.push(learner(2));
    const before = await roster();
    platform.failPage = 1;
    const failed = await call(app, 'POST', pullUrl, seed.instructorToken, undefined, 502);
    platform.failPage = undefined;
    expect(failed.body.error).toMatchObject({ code: 'platform-unavailable' });
    expect(failed.body.error.message).toContain('membership service');
    expect(await roster()).toEqual(before);
    const res = await call(app, 'POST', pullUrl, seed.instructorToken, undefined, 200);
    expect(res.body).toEqual({ enrolled: 1, withdrawn: 0, unchanged: 1 });
    expect((await byName('Learner 2'))?.history.map((h) => h.status)).toEqual(['enrolled', 'withdrawn', 'enrolled']);
  });

  it('reads the next page from a Link header with several links (RFC 8288; NRPS 2.0 pages by rel="next"), hand-written headers', () => {
    expect(nextPage('<https://p.example/m?p=1>; rel="differences", <https://p.example/m?p=2>; rel="next"')).toBe('https://p.example/m?p=2');
    expect(nextPage('<https://p.example/m?p=3>;rel=next')).toBe('https://p.example/m?p=3');
    expect(nextPage('<https://p.example/m?p=1>; rel="differences"')).toBeUndefined();
    expect(nextPage(null)).toBeUndefined();
  });

  it('a TA may not pull (the roster is changed by its instructor)', async () => {
    await call(app, 'POST', pullUrl, seed.taAToken, undefined, 403);
  });
});
