import type { FastifyInstance } from 'fastify';
import { createLocalJWKSet, generateKeyPair, importJWK, jwtVerify, SignJWT } from 'jose';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { storeLoginState } from '../../server/store/lti-launch-states.ts';
import { signingKey } from '../../server/store/lti-keys.ts';
import { listPlatforms } from '../../server/store/lti-platforms.ts';
import { ADMIN_TOKEN, call, type Seed } from '../support/api-fixture.ts';
import { PLATFORM_ROLES, TestPlatform, type PlatformUser } from '../support/lti-platform/test-platform.ts';
import { FORM, form, initiate as initiateLogin, postLaunch, postTicket, TOOL } from '../support/lti-platform/tool-launch.ts';
import { openToolAndPlatform, placeOnSectionA, registerPlatform, type ToolAndPlatform } from '../support/lti-platform/tool-fixture.ts';
import type { TestDatabase } from '../support/test-database.ts';

/**
 * LTI 1.3 launches from a test platform of our own (test/support/lti-platform), checked against the
 * 1EdTech specifications: LTI Core 1.3 and the Security Framework 1.0, named beside each check.
 */

// Invented people; their subject ids and names must never reach the log.
const learner: PlatformUser = { sub: 'sub-learner-7f3a91', name: 'Ada Quenby', roles: PLATFORM_ROLES.learner };
const instructor: PlatformUser = { sub: 'sub-instructor-2b8c', name: 'Bram Oakridge', roles: PLATFORM_ROLES.instructor };
const ta: PlatformUser = { sub: 'sub-ta-55d0e1', name: 'Cleo Vantress', roles: PLATFORM_ROLES.ta };
const mentor: PlatformUser = { sub: 'sub-mentor-9e41', name: 'Dov Marlowe', roles: PLATFORM_ROLES.mentor };
const everyone = [learner, instructor, ta, mentor];

describe('LTI 1.3 launch from a test platform', () => {
  let database: TestDatabase;
  let app: FastifyInstance;
  let platform: TestPlatform;
  let seed: Seed;
  let tool: ToolAndPlatform | undefined;
  const log: string[] = [];

  beforeAll(async () => {
    tool = await openToolAndPlatform({ log });
    ({ database, app, platform, seed } = tool);
    await placeOnSectionA(app, seed, platform, tool.platformId);
  }, 60_000);
  afterAll(() => tool?.close());

  // Thin wrappers: the refusal cases below need the auth request, the raw launch post and odd enter headers.
  const initiate = (user: PlatformUser) => initiateLogin(app, platform, user);
  const post = (fields: Record<string, string>) => postLaunch(app, fields);
  const enter = (page: string, headers?: Record<string, string>) => postTicket(app, page, headers);

  async function launchAs(user: PlatformUser) {
    const auth = await initiate(user);
    expect(auth.redirectUri).toBe(`${TOOL}/v1/lti/launch`);
    const launched = await post({ id_token: await platform.idToken(user, auth.nonce), state: auth.state });
    expect(launched.statusCode, launched.body).toBe(200);
    // No session is set on the cross-site post itself (docs/lti.md: the cookie waits for the same-site step).
    expect(launched.headers['set-cookie']).toBeUndefined();
    return launched;
  }

  async function sessionOf(user: PlatformUser) {
    const entered = await enter((await launchAs(user)).body);
    expect(entered.statusCode, entered.body).toBe(303);
    // A learner lands on their own pages, staff on the workspace.
    expect(entered.headers.location).toBe(user.roles.some((r) => r.endsWith('#Learner')) ? '/student' : '/');
    return String(entered.headers['set-cookie']).split(';')[0];
  }

  it('the tool redirects to the platform with every parameter of the authentication request (Security Framework 1.0, 5.1.1.2)', async () => {
    // readAuthRequest throws on any parameter missing or other than the specification's value.
    const auth = await initiate(learner);
    expect(auth.state.length).toBeGreaterThanOrEqual(32);
    expect(auth.nonce).not.toBe(auth.state);
  });

  it('a learner lands on their own pages, in the placed section, under a pseudonymous id (LTI Core 1.3, 5.3.7 and A.2.3: Learner)', async () => {
    const cookie = await sessionOf(learner);
    const me = await app.inject({ method: 'GET', url: '/v1/student/me', headers: { cookie } });
    expect(me.statusCode, me.body).toBe(200);
    const body = me.json();
    expect(body.section.id).toBe(seed.sectionA.id);
    expect(body.course.id).toBe(seed.course.id);
    expect(body.studentId).toMatch(/^lti-\d+$/);
    expect(body.displayName).toBe(learner.name);
    expect(me.body).not.toContain(learner.sub);
    // A second launch by the same subject is the same student (LTI Core 1.3, 5.3.6: sub is stable).
    const again = await app.inject({ method: 'GET', url: '/v1/student/me', headers: { cookie: await sessionOf(learner) } });
    expect(again.json().studentId).toBe(body.studentId);
  });

  it('an instructor lands on the staff side as an instructor of the course (A.2.3: Instructor)', async () => {
    const cookie = await sessionOf(instructor);
    const me = await app.inject({ method: 'GET', url: '/v1/me', headers: { cookie } });
    expect(me.statusCode, me.body).toBe(200);
    expect(me.json().role).toBe('instructor');
    expect(me.json().courses.map((c: { id: number }) => c.id)).toEqual([seed.course.id]);
  });

  it('a teaching assistant (sent with Instructor, A.2.3.1) lands as a TA of the placed section only', async () => {
    const cookie = await sessionOf(ta);
    const me = (await app.inject({ method: 'GET', url: '/v1/me', headers: { cookie } })).json();
    expect(me.role).toBe('ta');
    const sections = me.courses[0].sections.map((s: { id: number }) => s.id);
    expect(sections).toEqual([seed.sectionA.id]);
    const other = await app.inject({ method: 'GET', url: `/v1/sections/${seed.sectionB.id}/roster`, headers: { cookie } });
    expect(other.statusCode).toBe(404);
  });

  it('a learner launching from a link not placed yet sees so, and gets no session', async () => {
    const auth = await initiate(learner);
    const claims = { 'https://purl.imsglobal.org/spec/lti/claim/resource_link': { id: 'link-not-placed' } };
    const res = await post({ id_token: await platform.idToken(learner, auth.nonce, { claims }), state: auth.state });
    expect(res.statusCode).toBe(200);
    expect(res.body).toContain('not placed yet');
    expect(res.body).not.toContain('name="ticket"');
  });

  /** Each refusal: a 401 page naming its code, the code in the log, no session. */
  async function expectRefused(res: { statusCode: number; body: string; headers: Record<string, unknown> }, code: string) {
    expect(res.statusCode, res.body).toBe(401);
    expect(res.body).toContain(code);
    expect(res.headers['set-cookie']).toBeUndefined();
    expect(log.some((line) => JSON.parse(line).ltiRefusal === code), `log has ${code}`).toBe(true);
  }

  const refusals: Array<[string, string, () => Promise<Awaited<ReturnType<typeof post>>>]> = [
    // Security Framework 1.0, 5.1.3 item 9 and 5.1.1.3: a nonce (with its state) is used once; the same post again is a replay.
    ['replayed (nonce seen)', 'nonce-replayed', async () => {
      const auth = await initiate(learner);
      const fields = { id_token: await platform.idToken(learner, auth.nonce), state: auth.state };
      expect((await post(fields)).statusCode).toBe(200);
      return post(fields);
    }],
    // Security Framework 1.0, 5.1.3 item 7: exp in the past (beyond the minute of clock skew allowed).
    ['expired', 'token-expired', async () => {
      const auth = await initiate(learner);
      const now = Math.floor(Date.now() / 1000);
      return post({ id_token: await platform.idToken(learner, auth.nonce, { iat: now - 600, exp: now - 300 }), state: auth.state });
    }],
    // Security Framework 1.0, 5.1.3 item 8: iat far older than the tool accepts.
    ['issued too long ago', 'bad-issued-at', async () => {
      const auth = await initiate(learner);
      const now = Math.floor(Date.now() / 1000);
      return post({ id_token: await platform.idToken(learner, auth.nonce, { iat: now - 3600, exp: now + 300 }), state: auth.state });
    }],
    // Security Framework 1.0, 5.1.3 item 3: aud does not contain our client id.
    ['other audience', 'wrong-audience', async () => {
      const auth = await initiate(learner);
      return post({ id_token: await platform.idToken(learner, auth.nonce, { aud: 'some-other-tool' }), state: auth.state });
    }],
    // Security Framework 1.0, 5.1.3 items 4-5: several audiences, azp not ours.
    ['several audiences, azp another tool', 'wrong-audience', async () => {
      const auth = await initiate(learner);
      return post({ id_token: await platform.idToken(learner, auth.nonce, { aud: [platform.clientId, 'some-other-tool'], claims: { azp: 'some-other-tool' } }), state: auth.state });
    }],
    // LTI Core 1.3, 5.3.3: the deployment id must be one registered.
    ['unknown deployment', 'unknown-deployment', async () => {
      const auth = await initiate(learner);
      return post({ id_token: await platform.idToken(learner, auth.nonce, { claims: { 'https://purl.imsglobal.org/spec/lti/claim/deployment_id': 'deployment-unknown' } }), state: auth.state });
    }],
    // Security Framework 1.0, 5.1.3 item 1: signed by a key not in the platform's key set.
    ['bad signature', 'bad-signature', async () => {
      const auth = await initiate(learner);
      const { privateKey } = await generateKeyPair('RS256');
      return post({ id_token: await platform.idToken(learner, auth.nonce, { key: privateKey }), state: auth.state });
    }],
    // Security Framework 1.0, 5.1.3 item 2: iss must be exactly the registered issuer.
    ['unknown issuer in the token', 'unknown-issuer', async () => {
      const auth = await initiate(learner);
      return post({ id_token: await platform.idToken(learner, auth.nonce, { iss: 'https://platform.invalid' }), state: auth.state });
    }],
    // Security Framework 1.0, 5.1.1.1: a login initiated by an issuer not registered.
    ['unknown issuer at login', 'unknown-issuer', async () => {
      const fields = { ...platform.loginInitiation(learner, TOOL), iss: 'https://platform.invalid' };
      return app.inject({ method: 'POST', url: '/v1/lti/login', headers: FORM, payload: form(fields) });
    }],
    // Security Framework 1.0, 5.1.1.3: the state must be one the tool issued.
    ['missing state', 'state-missing', async () => {
      const auth = await initiate(learner);
      return post({ id_token: await platform.idToken(learner, auth.nonce) });
    }],
    ['mismatched state', 'state-unknown', async () => {
      const auth = await initiate(learner);
      return post({ id_token: await platform.idToken(learner, auth.nonce), state: 'not-a-state-we-issued' });
    }],
    // Security Framework 1.0, 5.1.3 item 9: the nonce must be the one sent with this state.
    ['nonce of another login', 'nonce-mismatch', async () => {
      const [first, second] = [await initiate(learner), await initiate(learner)];
      return post({ id_token: await platform.idToken(learner, first.nonce), state: second.state });
    }],
    // LTI Core 1.3, 5.3.2: version 1.3.0.
    ['another version', 'wrong-version', async () => {
      const auth = await initiate(learner);
      return post({ id_token: await platform.idToken(learner, auth.nonce, { claims: { 'https://purl.imsglobal.org/spec/lti/claim/version': '1.2.0' } }), state: auth.state });
    }],
    // LTI Core 1.3, 5.3.1: only the message types the tool knows.
    ['another message type', 'unknown-message-type', async () => {
      const auth = await initiate(learner);
      return post({ id_token: await platform.idToken(learner, auth.nonce, { claims: { 'https://purl.imsglobal.org/spec/lti/claim/message_type': 'LtiSomethingElse' } }), state: auth.state });
    }],
    // LTI Core 1.3, 5.3.5: a resource link launch names its resource link.
    ['no resource link id', 'claims-missing', async () => {
      const auth = await initiate(learner);
      return post({ id_token: await platform.idToken(learner, auth.nonce, { claims: { 'https://purl.imsglobal.org/spec/lti/claim/resource_link': {} } }), state: auth.state });
    }],
    // Security Framework 1.0, 5.1.3 item 6: RS256 only; an HMAC-signed token is refused before any key is looked up.
    ['signed HS256', 'algorithm-not-allowed', async () => {
      const auth = await initiate(learner);
      const token = await new SignJWT(platform.launchClaims(learner, auth.nonce))
        .setProtectedHeader({ alg: 'HS256' })
        .setIssuer(platform.issuer)
        .setSubject(learner.sub)
        .setAudience(platform.clientId)
        .setIssuedAt()
        .setExpirationTime('5m')
        .sign(new TextEncoder().encode('a-shared-secret-of-32-bytes-long!'));
      return post({ id_token: token, state: auth.state });
    }],
    ['no id_token', 'token-missing', async () => post({ state: (await initiate(learner)).state })],
    ['an id_token that is no JWT', 'token-malformed', async () => post({ id_token: 'not-a-jwt', state: (await initiate(learner)).state })],
    // Security Framework 1.0, 5.1.1.3: a state is short-lived (stored here as one already past its time).
    ['expired state', 'state-expired', async () => {
      const [platformRow] = await listPlatforms(database.store.db);
      await storeLoginState(database.store.db, 'a-state-past-its-time', 'a-nonce-past-its-time', platformRow.id, -1);
      return post({ id_token: await platform.idToken(learner, 'a-nonce-past-its-time'), state: 'a-state-past-its-time' });
    }],
    // LTI Core 1.3, A.2.3: a role with no counterpart here opens nothing.
    ['a role not mapped', 'no-mapped-role', async () => {
      const auth = await initiate(mentor);
      return post({ id_token: await platform.idToken(mentor, auth.nonce), state: auth.state });
    }],
  ];

  it.each(refusals)('refuses a launch: %s (%s)', async (_kind, code, send) => {
    await expectRefused(await send(), code);
  });

  it("refuses a launch when the platform's key set cannot be fetched (platform-keys-unreachable)", async () => {
    // A second platform, registered, whose key set server has gone away.
    const gone = await TestPlatform.start();
    await registerPlatform(app, gone, seed.course.id);
    const res = await app.inject({ method: 'GET', url: `/v1/lti/login?${form(gone.loginInitiation(learner, TOOL))}` });
    const auth = gone.readAuthRequest(String(res.headers.location), learner);
    const token = await gone.idToken(learner, auth.nonce);
    await gone.close();
    await expectRefused(await post({ id_token: token, state: auth.state }), 'platform-keys-unreachable');
  });

  it('refuses a learner withdrawn here (not-enrolled)', async () => {
    const withdrawn: PlatformUser = { sub: 'sub-learner-withdrawn-41', name: 'Eli Withers', roles: PLATFORM_ROLES.learner };
    everyone.push(withdrawn);
    const me = (await app.inject({ method: 'GET', url: '/v1/student/me', headers: { cookie: await sessionOf(withdrawn) } })).json();
    await call(app, 'PUT', `/v1/sections/${seed.sectionA.id}/roster/${me.studentId}`, seed.instructorToken, { status: 'withdrawn' }, 200);
    const auth = await initiate(withdrawn);
    await expectRefused(await post({ id_token: await platform.idToken(withdrawn, auth.nonce), state: auth.state }), 'not-enrolled');
  });

  it('a ticket is taken once, and only from a page of this origin (login cross-site request forgery)', async () => {
    const page = (await launchAs(learner)).body;
    await expectRefused(await enter(page, { origin: 'https://elsewhere.invalid', host: 'localhost:80' }), 'ticket-cross-site');
    // A browser's own word (Fetch Metadata) is taken first; `Origin: null` (a page without referrers) is no origin.
    await expectRefused(await enter(page, { 'sec-fetch-site': 'cross-site', origin: 'http://localhost:80', host: 'localhost:80' }), 'ticket-cross-site');
    await expectRefused(await enter(page, { origin: 'null', host: 'localhost:80' }), 'ticket-cross-site');
    expect((await enter(page)).statusCode).toBe(303);
    await expectRefused(await enter(page), 'ticket-unknown');
  });

  it('form posts are read on the LTI routes only: a form another site posts to a sign-in route is a 415', async () => {
    const res = await app.inject({ method: 'POST', url: '/v1/session', headers: FORM, payload: form({ token: seed.instructorToken }) });
    expect(res.statusCode).toBe(415);
    expect(res.headers['set-cookie']).toBeUndefined();
  });

  it('the log names no subject id and no name of anyone who launched (common practice, no source: personal data only as ids)', () => {
    const text = log.join('\n');
    expect(log.length).toBeGreaterThan(0);
    for (const user of everyone) {
      expect(text).not.toContain(user.sub);
      expect(text).not.toContain(user.name);
    }
  });

  it("a platform's key rotation is followed: a token signed by its new key verifies (Security Framework 1.0, 6.3)", async () => {
    await platform.rotateKey();
    // The tool refetches a platform's key set for a kid it has not seen at most once a second (server/lti/platform-keys.ts).
    await new Promise((resolve) => setTimeout(resolve, 1100));
    expect((await app.inject({ method: 'GET', url: '/v1/student/me', headers: { cookie: await sessionOf(learner) } })).statusCode).toBe(200);
  });

  it('our key set: rotation makes a new signing key and keeps the old one served (Security Framework 1.0, 6.3)', async () => {
    const before = (await app.inject({ method: 'GET', url: '/v1/lti/jwks' })).json();
    expect(before.keys).toHaveLength(1);
    const rotated = await call(app, 'POST', '/v1/lti/keys/rotate', ADMIN_TOKEN, undefined, 201);
    expect(rotated.body.retired).toBe(before.keys[0].kid);
    const after = (await app.inject({ method: 'GET', url: '/v1/lti/jwks' })).json();
    expect(after.keys.map((k: { kid: string }) => k.kid)).toEqual([rotated.body.kid, before.keys[0].kid]);
    // The private key stored signs, and jose (independent of the tool's code) verifies it against the served set; no private part is served.
    const key = (await signingKey(database.store.db))!;
    expect(key.kid).toBe(rotated.body.kid);
    const jwt = await new SignJWT({ probe: 1 }).setProtectedHeader({ alg: 'RS256', kid: key.kid }).sign(await importJWK(key.privateJwk, 'RS256'));
    await expect(jwtVerify(jwt, createLocalJWKSet(after))).resolves.toBeDefined();
    for (const k of after.keys) expect(Object.keys(k).sort()).toEqual(['alg', 'e', 'kid', 'kty', 'n', 'use']);
  });

  it('six rotations at once all succeed, one after another: one key signs, the others stay served (no 500)', async () => {
    const before = (await app.inject({ method: 'GET', url: '/v1/lti/jwks' })).json();
    const rotations = await Promise.all([1, 2, 3, 4, 5, 6].map(() => app.inject({ method: 'POST', url: '/v1/lti/keys/rotate', headers: { authorization: `Bearer ${ADMIN_TOKEN}` } })));
    expect(rotations.map((r) => r.statusCode)).toEqual([201, 201, 201, 201, 201, 201]);
    const kids = rotations.map((r) => r.json().kid as string);
    // Taking turns, each rotation retires the key that signed just before it: the retired kids are the
    // signing key before the six and five of the six new ones, each once (hand-worked). Without the
    // turns, some of the six met the one-signing-key index and answered 500.
    const retired = rotations.map((r) => r.json().retired as string);
    expect(new Set(retired).size).toBe(6);
    expect(retired).toContain(before.keys[0].kid);
    const signing = (await signingKey(database.store.db))!.kid;
    expect(kids).toContain(signing);
    expect(retired).not.toContain(signing);
    const served = (await app.inject({ method: 'GET', url: '/v1/lti/jwks' })).json().keys.map((k: { kid: string }) => k.kid);
    for (const kid of [...kids, before.keys[0].kid]) expect(served).toContain(kid);
  });

  it('registration: the admin lists and replaces a platform; a bad URL is a 400 naming the field', async () => {
    const list = await call(app, 'GET', '/v1/lti/platforms', ADMIN_TOKEN, undefined, 200);
    const registered = list.body.platforms.find((p: { issuer: string }) => p.issuer === platform.issuer);
    expect(registered.deploymentIds).toEqual([platform.deploymentId]);
    const replaced = await call(app, 'PUT', `/v1/lti/platforms/${registered.id}`, ADMIN_TOKEN, { ...platform.registration(seed.course.id), deploymentIds: ['deployment-1', 'deployment-2'] }, 200);
    expect(replaced.body.deploymentIds).toEqual(['deployment-1', 'deployment-2']);
    const bad = await call(app, 'POST', '/v1/lti/platforms', ADMIN_TOKEN, { ...platform.registration(seed.course.id), jwksUrl: 'not a url' }, 400);
    expect(bad.body.error.details.map((d: { path: string }) => d.path)).toContain('body.jwksUrl');
    await call(app, 'POST', '/v1/lti/platforms', ADMIN_TOKEN, platform.registration(seed.course.id), 409);
    // Its resource link is placed in this course (the set-up), so it cannot be bound to another.
    const other = await call(app, 'POST', '/v1/courses', ADMIN_TOKEN, { name: 'Another course (invented)' }, 201);
    const moved = await call(app, 'PUT', `/v1/lti/platforms/${registered.id}`, ADMIN_TOKEN, { ...platform.registration(other.body.id) }, 409);
    expect(moved.body.error.details[0].path).toBe('body.courseId');
  });
});
