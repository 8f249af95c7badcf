import { randomUUID } from 'node:crypto';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { exportJWK, generateKeyPair, SignJWT, type CryptoKey } from 'jose';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { PLATFORM_ROLES, TestPlatform } from '../support/lti-platform/test-platform.ts';

/**
 * The test platform's assignment and grade services checked against the specifications, before our
 * tool's tests rely on them: no Rateproof server, only fetch against the platform and a key set this
 * test serves as the tool's. Every expected value is written here from the specification text (AGS
 * 2.0, Deep Linking 2.0, RFC 6749 and RFC 6750; AGS and Deep Linking section numbers from memory),
 * never read back from the platform's code.
 */
const AGS_CLAIM = 'https://purl.imsglobal.org/spec/lti-ags/claim/endpoint';
const SCOPE = {
  lineItem: 'https://purl.imsglobal.org/spec/lti-ags/scope/lineitem',
  lineItemReadonly: 'https://purl.imsglobal.org/spec/lti-ags/scope/lineitem.readonly',
  resultReadonly: 'https://purl.imsglobal.org/spec/lti-ags/scope/result.readonly',
  score: 'https://purl.imsglobal.org/spec/lti-ags/scope/score',
  nrps: 'https://purl.imsglobal.org/spec/lti-nrps/scope/contextmembership.readonly',
};
const LINE_ITEM = 'application/vnd.ims.lis.v2.lineitem+json';
const CONTAINER = 'application/vnd.ims.lis.v2.lineitemcontainer+json';
const SCORE = 'application/vnd.ims.lis.v1.score+json';
const RESULTS = 'application/vnd.ims.lis.v2.resultcontainer+json';
const LTI = 'https://purl.imsglobal.org/spec/lti/claim/';
const DL = 'https://purl.imsglobal.org/spec/lti-dl/claim/';
const learner = { sub: 'sub-ags-learner-1', name: 'Ada Quill', roles: PLATFORM_ROLES.learner };

describe('the test platform follows AGS 2.0 where our tool relies on it', () => {
  let platform: TestPlatform;
  let keyServer: Server;
  let toolKey: { privateKey: CryptoKey; kid: string };
  let container: string;

  beforeAll(async () => {
    platform = await TestPlatform.start();
    const { publicKey, privateKey } = await generateKeyPair('RS256');
    toolKey = { privateKey, kid: 'tool-key-1' };
    const keySet = JSON.stringify({ keys: [{ ...(await exportJWK(publicKey)), kid: toolKey.kid, alg: 'RS256', use: 'sig' }] });
    keyServer = createServer((_, response) => response.writeHead(200, { 'content-type': 'application/json' }).end(keySet));
    await new Promise<void>((resolve) => keyServer.listen(0, '127.0.0.1', resolve));
    platform.toolKeySetUrl = `http://127.0.0.1:${(keyServer.address() as AddressInfo).port}/jwks`;
    container = (platform.launchClaims(learner, 'nonce-1')[AGS_CLAIM] as { lineitems: string }).lineitems;
  });
  afterAll(async () => {
    await platform?.close();
    await new Promise((resolve) => keyServer?.close(resolve));
  });

  /** RFC 7523 client assertion (Security Framework 1.0, 4.1), signed with the tool's key, for the scopes asked. */
  async function tokenResponse(scope: string): Promise<Response> {
    const assertion = await new SignJWT({})
      .setProtectedHeader({ alg: 'RS256', kid: toolKey.kid })
      .setIssuer(platform.clientId)
      .setSubject(platform.clientId)
      .setAudience(`${platform.base}/token`)
      .setIssuedAt()
      .setExpirationTime('5m')
      .setJti(randomUUID())
      .sign(toolKey.privateKey);
    const form = {
      grant_type: 'client_credentials',
      client_assertion_type: 'urn:ietf:params:oauth:client-assertion-type:jwt-bearer',
      client_assertion: assertion,
      scope,
    };
    return fetch(`${platform.base}/token`, { method: 'POST', headers: { 'content-type': 'application/x-www-form-urlencoded' }, body: new URLSearchParams(form) });
  }
  async function token(...scopes: string[]): Promise<string> {
    const res = await tokenResponse(scopes.join(' '));
    expect(res.status, await res.clone().text()).toBe(200);
    return ((await res.json()) as { access_token: string }).access_token;
  }

  const postLineItem = (bearer: string, body: unknown, type = LINE_ITEM) =>
    fetch(container, { method: 'POST', headers: { authorization: `Bearer ${bearer}`, 'content-type': type }, body: JSON.stringify(body) });
  const listLineItems = (bearer: string, query = '', accept = CONTAINER) =>
    fetch(`${container}${query}`, { headers: { authorization: `Bearer ${bearer}`, accept } });
  /** AGS 2.0, 3.4 (from memory): the scores endpoint is the line item URL with /scores added to its path, its query kept. */
  const scoresUrl = (lineItemId: string) => {
    const url = new URL(lineItemId);
    url.pathname += '/scores';
    return url.toString();
  };
  const postScore = (bearer: string, lineItemId: string, body: unknown, type = SCORE) =>
    fetch(scoresUrl(lineItemId), { method: 'POST', headers: { authorization: `Bearer ${bearer}`, 'content-type': type }, body: JSON.stringify(body) });
  const score = (userId: string, scoreGiven: number, timestamp: string) => ({
    userId,
    scoreGiven,
    scoreMaximum: 10,
    comment: 'feedback at the tool',
    timestamp,
    activityProgress: 'Completed',
    gradingProgress: 'FullyGraded',
  });

  it('offers the services in every launch: the four AGS scopes and the context container (AGS 2.0, 3.1)', () => {
    const claim = platform.launchClaims(learner, 'nonce-2')[AGS_CLAIM] as { scope: string[]; lineitems: string; lineitem?: string };
    expect([...claim.scope].sort()).toEqual([SCOPE.lineItem, SCOPE.lineItemReadonly, SCOPE.resultReadonly, SCOPE.score].sort());
    expect(claim.lineitems).toBe(`${platform.base}/contexts/${platform.contextId}/lineitems`);
    // No line item is bound to the launched link yet, so no `lineitem` (AGS 2.0, 3.1: present only when the link has one).
    expect(claim).not.toHaveProperty('lineitem');
  });

  it('grants any non-empty set of the scopes offered and refuses others as invalid_scope (RFC 6749, 5.2 and 3.3)', async () => {
    const granted = await tokenResponse(`${SCOPE.lineItem} ${SCOPE.score}`);
    expect(granted.status).toBe(200);
    // RFC 6749, 5.1: the scope granted is named in the answer.
    expect(((await granted.json()) as { scope: string }).scope.split(' ').sort()).toEqual([SCOPE.lineItem, SCOPE.score].sort());
    for (const asked of [`${SCOPE.score} https://purl.imsglobal.org/spec/lti-ags/scope/everything`, '']) {
      const refused = await tokenResponse(asked);
      expect(refused.status).toBe(400);
      expect(((await refused.json()) as { error: string }).error).toBe('invalid_scope');
    }
  });

  it('checks the scope of each service: 401 without a token, 403 without the scope (RFC 6750, 3.1; AGS 2.0, 3.2.1 and 3.4.1)', async () => {
    expect((await listLineItems('not-a-token')).status).toBe(401);
    const roster = await token(SCOPE.nrps);
    expect((await listLineItems(roster)).status).toBe(403);
    // The read-only scope may list but not add (AGS 2.0, 3.2.1: lineitem.readonly allows GET only).
    const readonly = await token(SCOPE.lineItemReadonly);
    expect((await listLineItems(readonly)).status).toBe(200);
    expect((await postLineItem(readonly, { scoreMaximum: 10, label: 'Not allowed' })).status).toBe(403);
    // The membership service wants its own scope.
    const ags = await token(SCOPE.lineItem, SCOPE.score);
    const members = await fetch(platform.membershipsUrl, { headers: { authorization: `Bearer ${ags}`, accept: 'application/vnd.ims.lti-nrps.v2.membershipcontainer+json' } });
    expect(members.status).toBe(403);
  });

  it('speaks the media types of the line item service (AGS 2.0, 3.2.2)', async () => {
    const bearer = await token(SCOPE.lineItem);
    expect((await listLineItems(bearer, '', 'application/json')).status).toBe(406);
    expect((await postLineItem(bearer, { scoreMaximum: 10, label: 'Plain JSON' }, 'application/json')).status).toBe(415);
    const made = await postLineItem(bearer, { scoreMaximum: 25, label: 'Kinetics lab 1', resourceId: 'lab-1', tag: 'grade' });
    expect(made.status).toBe(201);
    expect(made.headers.get('content-type')).toBe(LINE_ITEM);
    const item = (await made.json()) as { id: string; scoreMaximum: number; label: string };
    expect(item).toMatchObject({ scoreMaximum: 25, label: 'Kinetics lab 1', resourceId: 'lab-1', tag: 'grade' });
    expect(item.id.startsWith(`${container}/`)).toBe(true);
    // The id is the line item's URL (AGS 2.0, 3.2): a GET of it answers the item.
    const one = await fetch(item.id, { headers: { authorization: `Bearer ${bearer}`, accept: LINE_ITEM } });
    expect(one.status).toBe(200);
    expect(one.headers.get('content-type')).toBe(LINE_ITEM);
    expect(await one.json()).toEqual(item);
    const list = await listLineItems(bearer);
    expect(list.headers.get('content-type')).toBe(CONTAINER);
  });

  it('refuses a line item without a label or with a scoreMaximum not above 0 (AGS 2.0, 3.2.7 and 3.2.8)', async () => {
    const bearer = await token(SCOPE.lineItem);
    for (const [body, field] of [
      [{ scoreMaximum: 0, label: 'Zero' }, 'scoreMaximum'],
      [{ scoreMaximum: -5, label: 'Negative' }, 'scoreMaximum'],
      [{ scoreMaximum: '10', label: 'A string' }, 'scoreMaximum'],
      [{ scoreMaximum: 10 }, 'label'],
      [{ scoreMaximum: 10, label: '   ' }, 'label'],
    ] as const) {
      const res = await postLineItem(bearer, body);
      expect(res.status, JSON.stringify(body)).toBe(400);
      expect(await res.text()).toContain(field);
    }
    // AGS 2.0, 3.2.10 (from memory): a resourceLinkId that is no link of the context is a 404.
    expect((await postLineItem(bearer, { scoreMaximum: 10, label: 'Nowhere', resourceLinkId: 'no-such-link' })).status).toBe(404);
  });

  it('filters the container by resource_id, resource_link_id and tag, together when several are given (AGS 2.0, 3.2.4)', async () => {
    const bearer = await token(SCOPE.lineItem);
    const made = [
      { scoreMaximum: 10, label: 'F1', resourceId: 'filter-a', tag: 'grade' },
      { scoreMaximum: 10, label: 'F2', resourceId: 'filter-a', tag: 'originality' },
      { scoreMaximum: 10, label: 'F3', resourceId: 'filter-b', tag: 'grade', resourceLinkId: platform.resourceLinkId },
    ];
    for (const body of made) expect((await postLineItem(bearer, body)).status).toBe(201);
    const labels = async (query: string) => ((await (await listLineItems(bearer, query)).json()) as Array<{ label: string }>).map((item) => item.label).filter((label) => /^F\d$/.test(label));
    expect(await labels('?resource_id=filter-a')).toEqual(['F1', 'F2']);
    expect(await labels('?resource_id=filter-a&tag=grade')).toEqual(['F1']);
    expect(await labels(`?resource_link_id=${platform.resourceLinkId}`)).toEqual(['F3']);
    expect(await labels('?resource_id=filter-c')).toEqual([]);
    // The link now has exactly one line item, so its launches name it (AGS 2.0, 3.1).
    const f3 = platform.lineItems.find((item) => item.label === 'F3')!;
    expect((platform.launchClaims(learner, 'nonce-3')[AGS_CLAIM] as { lineitem?: string }).lineitem).toBe(f3.id);
  });

  describe('scores', () => {
    let lineItemId: string;
    let bearer: string;
    beforeAll(async () => {
      const res = await postLineItem(await token(SCOPE.lineItem), { scoreMaximum: 10, label: 'Scored lab', resourceId: 'scored' });
      lineItemId = ((await res.json()) as { id: string }).id;
      bearer = await token(SCOPE.score);
    });

    it('accepts a score with the score scope and media type, and keeps it (AGS 2.0, 3.4.1 and 3.4.2)', async () => {
      const given = score('sub-s1', 7.5, '2026-03-01T10:00:00.123Z');
      expect((await postScore(bearer, lineItemId, given, 'application/json')).status).toBe(415);
      expect((await postScore(await token(SCOPE.lineItem), lineItemId, given)).status).toBe(403);
      const res = await postScore(bearer, lineItemId, given);
      expect([200, 201, 202, 204]).toContain(res.status);
      expect(platform.gradebook(lineItemId).get('sub-s1')).toEqual(given);
      // The line item URL's query is part of it: a score URL without it is no line item's.
      expect((await fetch(scoresUrl(lineItemId).split('?')[0], { method: 'POST', headers: { authorization: `Bearer ${bearer}`, 'content-type': SCORE }, body: JSON.stringify(given) })).status).toBe(404);
    });

    it('refuses what the score publish service forbids with a 400 naming the field (AGS 2.0, 3.4.3-3.4.8)', async () => {
      const good = score('sub-s2', 4, '2026-03-01T10:00:00.000Z');
      const { scoreMaximum: _max, ...withoutMaximum } = good;
      for (const [body, field] of [
        [withoutMaximum, 'scoreMaximum'], // 3.4.4: scoreMaximum must be present when scoreGiven is
        [{ ...good, scoreGiven: -1 }, 'scoreGiven'], // 3.4.3: 0 or more
        [{ ...good, scoreMaximum: 0 }, 'scoreMaximum'], // 3.4.4: greater than 0
        [{ ...good, userId: 42 }, 'userId'],
        [{ ...good, activityProgress: 'Done' }, 'activityProgress'], // 3.4.7: its five values
        [{ ...good, gradingProgress: 'Graded' }, 'gradingProgress'], // 3.4.8: its five values
        [{ ...good, timestamp: '1 March 2026' }, 'timestamp'], // 3.4.6: ISO 8601
        [{ ...good, timestamp: undefined }, 'timestamp'],
      ] as const) {
        const res = await postScore(bearer, lineItemId, body);
        expect(res.status, JSON.stringify(body)).toBe(400);
        expect(await res.text()).toContain(field);
      }
      expect(platform.gradebook(lineItemId).has('sub-s2')).toBe(false);
      // A score without scoreGiven (progress only) is allowed, and so is microsecond precision (3.4.6).
      const progress = { userId: 'sub-s2', timestamp: '2026-03-01T10:00:00.000001+01:00', activityProgress: 'Submitted', gradingProgress: 'Pending' };
      expect((await postScore(bearer, lineItemId, progress)).status).toBe(204);
    });

    it('keeps the score with the latest timestamp and ignores an older one (AGS 2.0, 3.4.6)', async () => {
      const first = score('sub-s3', 5, '2026-03-02T09:00:00.500Z');
      const newer = score('sub-s3', 8, '2026-03-02T09:00:00.501Z');
      const older = score('sub-s3', 2, '2026-03-02T09:00:00.499Z');
      for (const body of [first, newer, older]) expect((await postScore(bearer, lineItemId, body)).status).toBe(204);
      expect(platform.gradebook(lineItemId).get('sub-s3')?.scoreGiven).toBe(8);
      // The same instant in another offset is not older: 10:00:00.502+01:00 is 09:00:00.502Z.
      expect((await postScore(bearer, lineItemId, score('sub-s3', 9, '2026-03-02T10:00:00.502+01:00'))).status).toBe(204);
      expect(platform.gradebook(lineItemId).get('sub-s3')?.scoreGiven).toBe(9);
    });

    it('answers the results held to the result scope (AGS 2.0, 3.3)', async () => {
      const reader = await token(SCOPE.resultReadonly);
      const res = await fetch(`${scoresUrl(lineItemId).replace('/scores', '/results')}&user_id=sub-s3`, { headers: { authorization: `Bearer ${reader}`, accept: RESULTS } });
      expect(res.status).toBe(200);
      expect(await res.json()).toEqual([expect.objectContaining({ userId: 'sub-s3', scoreOf: lineItemId, resultScore: 9, resultMaximum: 10 })]);
    });

    it('failScoresAfter cuts the scores endpoint after that many accepted, until set again; down stops every service', async () => {
      const before = platform.scoreRequests;
      platform.failScoresAfter = 2;
      const statuses = [];
      for (const [n, userId] of ['sub-f1', 'sub-f2', 'sub-f3'].entries()) statuses.push((await postScore(bearer, lineItemId, score(userId, n, `2026-03-03T08:00:0${n}.000Z`))).status);
      expect(statuses).toEqual([204, 204, 503]);
      expect(platform.gradebook(lineItemId).has('sub-f3')).toBe(false);
      platform.failScoresAfter = undefined;
      expect((await postScore(bearer, lineItemId, score('sub-f3', 2, '2026-03-03T08:00:02.000Z'))).status).toBe(204);
      expect(platform.scoreRequests - before).toBe(4);
      platform.down = true;
      try {
        expect((await tokenResponse(SCOPE.score)).status).toBe(503);
        expect((await listLineItems(bearer)).status).toBe(503);
        expect((await postScore(bearer, lineItemId, score('sub-f4', 1, '2026-03-03T08:00:03.000Z'))).status).toBe(503);
      } finally {
        platform.down = false;
      }
    });
  });

  it("a deep-linked resource link with a lineItem gets a line item bound to it, named in the link's launches (Deep Linking 2.0, 3.3; AGS 2.0, 3.1)", async () => {
    const response = await new SignJWT({
      nonce: 'dl-nonce-1',
      [`${LTI}message_type`]: 'LtiDeepLinkingResponse',
      [`${LTI}version`]: '1.3.0',
      [`${LTI}deployment_id`]: platform.deploymentId,
      [`${DL}data`]: platform.deepLinkingData,
      [`${DL}content_items`]: [{ type: 'ltiResourceLink', title: 'Ester hydrolysis', lineItem: { scoreMaximum: 40, resourceId: 'rp-7', tag: 'rateproof' } }],
    })
      .setProtectedHeader({ alg: 'RS256', kid: toolKey.kid })
      .setIssuer(platform.clientId)
      .setAudience(platform.issuer)
      .setIssuedAt()
      .setExpirationTime('5m')
      .sign(toolKey.privateKey);
    const keySet = await (await fetch(platform.toolKeySetUrl)).json();
    const link = await platform.receiveDeepLinkingResponse(response, keySet);
    // Deep Linking 2.0, 3.3 (from memory): without a label the line item takes the item's title.
    const item = platform.lineItems.find((li) => li.id === link.lineItemId);
    expect(item).toMatchObject({ scoreMaximum: 40, label: 'Ester hydrolysis', resourceId: 'rp-7', tag: 'rateproof', resourceLinkId: link.resourceLinkId });
    expect((platform.linkClaims(link)[AGS_CLAIM] as { lineitem?: string }).lineitem).toBe(link.lineItemId);
    // The service lists it by its link too (AGS 2.0, 3.2.4).
    const listed = await listLineItems(await token(SCOPE.lineItemReadonly), `?resource_link_id=${link.resourceLinkId}`);
    expect(((await listed.json()) as Array<{ id: string }>).map((li) => li.id)).toEqual([link.lineItemId]);
  });
});
