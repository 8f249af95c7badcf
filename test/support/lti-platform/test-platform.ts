import { randomBytes } from 'node:crypto';
import { createServer, type IncomingHttpHeaders, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { createLocalJWKSet, decodeProtectedHeader, exportJWK, generateKeyPair, jwtVerify, SignJWT, type CryptoKey, type JWK } from 'jose';
import { AGS_CLAIM, AGS_SCOPES, AgsService, lineItemFields, type LineItem, type Score } from './ags-service.ts';
import { Refused, requireScope, type Answer } from './answer.ts';

/**
 * A learning platform of our own making, written from the 1EdTech specifications (LTI Core 1.3 and
 * the Security Framework 1.0): its own RS256 key pair, its key set served over HTTP on a free port,
 * login initiation, id_token issue, a token endpoint, the membership service (NRPS 2.0) and the
 * assignment and grade services (AGS 2.0, in ags-service.ts). No platform product is run or imitated.
 */

const LTI = 'https://purl.imsglobal.org/spec/lti/claim/';
const NRPS_CLAIM = 'https://purl.imsglobal.org/spec/lti-nrps/claim/namesroleservice';
const NRPS_SCOPE = 'https://purl.imsglobal.org/spec/lti-nrps/scope/contextmembership.readonly';
const NRPS_MEDIA_TYPE = 'application/vnd.ims.lti-nrps.v2.membershipcontainer+json';
/** The scopes a tool may ask the token endpoint for: the services this platform has. */
const OFFERED_SCOPES: string[] = [NRPS_SCOPE, ...Object.values(AGS_SCOPES)];
const DL = 'https://purl.imsglobal.org/spec/lti-dl/claim/';
const MEMBERSHIP = 'http://purl.imsglobal.org/vocab/lis/v2/membership';
/** Context roles (LTI Core 1.3, A.2.3); a TA is sent with its principal role too (A.2.3.1). */
export const PLATFORM_ROLES = {
  learner: [`${MEMBERSHIP}#Learner`],
  instructor: [`${MEMBERSHIP}#Instructor`],
  ta: [`${MEMBERSHIP}#Instructor`, `${MEMBERSHIP}/Instructor#TeachingAssistant`],
  mentor: [`${MEMBERSHIP}#Mentor`],
} as const;

export interface PlatformUser {
  sub: string;
  name: string;
  roles: readonly string[];
}

/** A resource link the platform made from a tool's deep linking response (Deep Linking 2.0, 3.1 and 4.5), with the line item it asked for. */
export interface DeepLinkedItem {
  resourceLinkId: string;
  title: string;
  custom: Record<string, string>;
  lineItemId?: string;
}

/** A member of the context as the membership service lists them (NRPS 2.0). */
export interface ContextMember {
  user_id: string;
  name?: string;
  roles: readonly string[];
  status?: 'Active' | 'Inactive' | 'Deleted';
}

export interface AuthRequest {
  state: string;
  nonce: string;
  redirectUri: string;
  loginHint: string;
}

const escape = (text: string) => text.replace(/[&<>"']/g, (c) => `&#${c.charCodeAt(0)};`);

/** A page that form-posts its fields at once, as a platform's browser pages do. */
function postingPage(action: string, fields: Record<string, string>): string {
  const inputs = Object.entries(fields).map(([name, value]) => `<input type="hidden" name="${escape(name)}" value="${escape(value)}">`);
  return `<!doctype html><html><body><form method="post" action="${escape(action)}">${inputs.join('')}</form><script>document.forms[0].submit()</script></body></html>`;
}

export class TestPlatform {
  readonly clientId = 'rateproof-tool-1';
  readonly deploymentId = 'deployment-1';
  readonly contextId = 'context-kinetics-1';
  readonly resourceLinkId = 'link-lab-3';
  /** Opaque to the tool, echoed in its response (Deep Linking 2.0, 4.4.1). */
  readonly deepLinkingData = 'platform-state-8c1e';
  private keyCount = 0;
  private linkCount = 0;
  /** The resource links of the context: the fixed one and those made by deep linking. */
  private readonly links = new Set<string>([this.resourceLinkId]);
  /** AGS 2.0 for the one context; its switches and readers are the platform's own below. */
  private readonly ags: AgsService;

  private constructor(
    private readonly server: Server,
    readonly base: string,
    private key: { privateKey: CryptoKey; kid: string },
    private jwks: JWK[],
  ) {
    this.ags = new AgsService(`${base}/contexts/${encodeURIComponent(this.contextId)}/lineitems`, (id) => this.links.has(id));
  }

  static async start(): Promise<TestPlatform> {
    const holder: { platform?: TestPlatform } = {};
    const server = createServer((request, response) => {
      const chunks: Buffer[] = [];
      request.on('data', (chunk: Buffer) => chunks.push(chunk));
      request.on('end', () => holder.platform!.answer(request.method ?? 'GET', request.url ?? '/', Buffer.concat(chunks).toString(), request.headers).then(
        ({ type, body, status, headers }) => response.writeHead(status ?? 200, { ...headers, 'content-type': type }).end(body),
        (error: Error) => {
          const status = error instanceof Refused ? error.status : error.message === 'not found' ? 404 : 400;
          response.writeHead(status, { ...(error instanceof Refused ? error.headers : {}), 'content-type': 'text/plain' }).end(error.message);
        },
      ));
    });
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
    const platform = new TestPlatform(server, base, { privateKey: undefined as never, kid: '' }, []);
    holder.platform = platform;
    await platform.rotateKey();
    return platform;
  }

  /** The people a browser may sign in as at this platform, by their subject id (the login hint). */
  readonly users = new Map<string, PlatformUser>();
  /** What the browser's next launch is: a resource link launch, or a deep linking request. */
  nextMessage: 'resource-link' | 'deep-linking' = 'resource-link';
  /** Where the tool serves its key set, for checking its deep linking responses (set by a browser test). */
  toolKeySetUrl = '';
  /** The links made from the tool's deep linking responses posted to the return URL. */
  readonly deepLinked: DeepLinkedItem[] = [];

  /**
   * The platform's pages, for a browser: its key set (Security Framework 1.0, 6.3); a start page that
   * initiates login at the tool by form POST (5.1.1.1); and its authorisation endpoint, which answers
   * the tool's authentication request with the id_token form-posted back (5.1.1.2-5.1.1.3).
   */
  private async answer(method: string, path: string, body: string, headers: IncomingHttpHeaders): Promise<Answer> {
    const url = new URL(path, this.base);
    if (url.pathname === '/token' || url.pathname === '/memberships' || url.pathname.startsWith('/contexts/')) {
      if (this.down) return { type: 'text/plain', body: 'down for maintenance', status: 503 };
      if (url.pathname === '/token') return this.issueToken(body);
      const granted = this.tokens.get(/^Bearer (.+)$/.exec(headers.authorization ?? '')?.[1] ?? '');
      return url.pathname === '/memberships' ? this.membership(url, headers, granted) : this.ags.answer(method, url, body, headers, granted);
    }
    if (url.pathname === '/jwks') return { type: 'application/json', body: JSON.stringify({ keys: this.jwks }) };
    // Deep Linking 2.0, 4.5: the tool form-posts its response as the field JWT to the return URL.
    if (url.pathname === '/deep-link-return') {
      const keySet = (await (await fetch(this.toolKeySetUrl)).json()) as { keys: JWK[] };
      this.deepLinked.push(await this.receiveDeepLinkingResponse(new URLSearchParams(body).get('JWT') ?? '', keySet));
      return { type: 'text/html', body: '<!doctype html><html><body><p>Activity placed.</p></body></html>' };
    }
    const user = this.users.get(url.searchParams.get(url.pathname === '/auth' ? 'login_hint' : 'sub') ?? '');
    if (url.pathname === '/start' && user) {
      return { type: 'text/html', body: postingPage(`${url.searchParams.get('tool')}/v1/lti/login`, this.loginInitiation(user, url.searchParams.get('tool')!)) };
    }
    if (url.pathname === '/auth' && user) {
      const auth = this.readAuthRequest(url.toString(), user);
      const idToken = await this.idToken(user, auth.nonce, { deepLinking: this.nextMessage === 'deep-linking' });
      return { type: 'text/html', body: postingPage(auth.redirectUri, { id_token: idToken, state: auth.state }) };
    }
    throw new Error('not found');
  }

  get issuer(): string {
    return this.base;
  }

  /** What the admin registers of this platform in Rateproof. */
  registration(courseId: number) {
    return { courseId, issuer: this.issuer, clientId: this.clientId, deploymentIds: [this.deploymentId], authUrl: `${this.base}/auth`, tokenUrl: `${this.base}/token`, jwksUrl: `${this.base}/jwks` };
  }

  /** A new key pair signs from now on; the old public key stays in the set. */
  async rotateKey(): Promise<void> {
    const { publicKey, privateKey } = await generateKeyPair('RS256');
    const kid = `platform-key-${++this.keyCount}`;
    this.key = { privateKey, kid };
    this.jwks.push({ ...(await exportJWK(publicKey)), kid, alg: 'RS256', use: 'sig' });
  }

  /** Security Framework 1.0, 5.1.1.1: the third-party initiated login's parameters, for one user. */
  loginInitiation(user: PlatformUser, toolBase: string): Record<string, string> {
    return {
      iss: this.issuer,
      login_hint: user.sub,
      target_link_uri: `${toolBase}/`,
      lti_message_hint: this.resourceLinkId,
      client_id: this.clientId,
      lti_deployment_id: this.deploymentId,
    };
  }

  /**
   * The platform's side of the authentication request (Security Framework 1.0, 5.1.1.2): the tool's
   * redirect must carry every parameter the specification names, with these values; throws otherwise.
   */
  readAuthRequest(location: string, user: PlatformUser): AuthRequest {
    const url = new URL(location);
    if (`${url.origin}${url.pathname}` !== `${this.base}/auth`) throw new Error(`not this platform's auth URL: ${url.origin}${url.pathname}`);
    const p = url.searchParams;
    const want = { scope: 'openid', response_type: 'id_token', response_mode: 'form_post', prompt: 'none', client_id: this.clientId, login_hint: user.sub, lti_message_hint: this.resourceLinkId };
    for (const [name, value] of Object.entries(want)) if (p.get(name) !== value) throw new Error(`${name} is ${p.get(name)}, not ${value}`);
    for (const name of ['state', 'nonce', 'redirect_uri']) if (!p.get(name)) throw new Error(`${name} missing`);
    return { state: p.get('state')!, nonce: p.get('nonce')!, redirectUri: p.get('redirect_uri')!, loginHint: user.sub };
  }

  /** The claims of a resource link launch (LTI Core 1.3, 5.3 and 5.4) for a user. */
  launchClaims(user: PlatformUser, nonce: string): Record<string, unknown> {
    return {
      nonce,
      name: user.name,
      [`${LTI}message_type`]: 'LtiResourceLinkRequest',
      [`${LTI}version`]: '1.3.0',
      [`${LTI}deployment_id`]: this.deploymentId,
      [`${LTI}target_link_uri`]: 'ignored-by-the-tool',
      [`${LTI}resource_link`]: { id: this.resourceLinkId },
      [`${LTI}roles`]: [...user.roles],
      [`${LTI}context`]: { id: this.contextId },
      // NRPS 2.0: the context's membership service, offered in every launch.
      [NRPS_CLAIM]: { context_memberships_url: this.membershipsUrl, service_versions: ['2.0'] },
      // AGS 2.0, 3.1: the context's line items, and the launched link's own when it has one.
      [AGS_CLAIM]: this.ags.claim(this.resourceLinkId),
    };
  }

  get deepLinkReturnUrl(): string {
    return `${this.base}/deep-link-return`;
  }

  /**
   * The claims of a deep linking request (Deep Linking 2.0, 4.4): LTI Core's common claims without a
   * resource link, and the settings: where to return, the item types accepted, and data to echo.
   */
  deepLinkingClaims(user: PlatformUser, nonce: string): Record<string, unknown> {
    const { [`${LTI}resource_link`]: _link, ...common } = this.launchClaims(user, nonce);
    return {
      ...common,
      // No resource link yet, so no line item of one (AGS 2.0, 3.1).
      [AGS_CLAIM]: this.ags.claim(),
      [`${LTI}message_type`]: 'LtiDeepLinkingRequest',
      [`${DL}deep_linking_settings`]: {
        deep_link_return_url: this.deepLinkReturnUrl,
        accept_types: ['ltiResourceLink'],
        accept_presentation_document_targets: ['window'],
        accept_multiple: false,
        data: this.deepLinkingData,
      },
    };
  }

  /**
   * The platform's side of a deep linking response (Deep Linking 2.0, 4.5), checked with jose against
   * the tool's key set as served: RS256 signature by a key of that set named in the header; iss the
   * client id, aud this platform; iat and exp present; a nonce; the message type, version and
   * deployment; the data echoed; one LTI resource link. The link is made, with a resource link id of
   * the platform's, and returned. Throws on any check that fails.
   */
  async receiveDeepLinkingResponse(jwt: string, toolKeySet: { keys: JWK[] }): Promise<DeepLinkedItem> {
    const header = decodeProtectedHeader(jwt);
    if (header.alg !== 'RS256' || typeof header.kid !== 'string') throw new Error(`header: alg ${header.alg}, kid ${header.kid}`);
    const { payload } = await jwtVerify(jwt, createLocalJWKSet(toolKeySet), {
      algorithms: ['RS256'],
      issuer: this.clientId,
      audience: this.issuer,
      requiredClaims: ['iat', 'exp', 'nonce'],
      maxTokenAge: '5m',
    });
    const want = { [`${LTI}message_type`]: 'LtiDeepLinkingResponse', [`${LTI}version`]: '1.3.0', [`${LTI}deployment_id`]: this.deploymentId, [`${DL}data`]: this.deepLinkingData };
    for (const [claim, value] of Object.entries(want)) if (payload[claim] !== value) throw new Error(`${claim} is ${String(payload[claim])}, not ${value}`);
    const items = payload[`${DL}content_items`];
    if (!Array.isArray(items) || items.length !== 1) throw new Error('not exactly one content item');
    const item = items[0] as { type?: unknown; title?: unknown; custom?: unknown; lineItem?: unknown };
    if (item.type !== 'ltiResourceLink' || typeof item.title !== 'string') throw new Error(`content item: ${JSON.stringify(item)}`);
    const custom = (item.custom ?? {}) as Record<string, string>;
    if (Object.values(custom).some((v) => typeof v !== 'string')) throw new Error('custom parameters must be strings (LTI Core 1.3, 5.4.6)');
    const link: DeepLinkedItem = { resourceLinkId: `link-deep-${++this.linkCount}`, title: item.title, custom };
    this.links.add(link.resourceLinkId);
    // Deep Linking 2.0, 3.3 (ltiResourceLink's lineItem): a line item bound to the new link; its label
    // defaults to the item's title; scoreMaximum checked as the line item service checks it (AGS 2.0).
    if (item.lineItem !== undefined) {
      if (typeof item.lineItem !== 'object' || item.lineItem === null) throw new Error('lineItem is not an object');
      const fields = lineItemFields({ label: item.title, ...item.lineItem, resourceLinkId: link.resourceLinkId });
      link.lineItemId = this.ags.create(fields).id;
    }
    return link;
  }

  /**
   * The claims of a launch of a deep-linked resource link: its id, title and custom parameters (LTI
   * Core 1.3, 5.3.5 and 5.4.6), and its line item as `lineitem` (AGS 2.0, 3.1).
   */
  linkClaims(link: DeepLinkedItem): Record<string, unknown> {
    return { [`${LTI}resource_link`]: { id: link.resourceLinkId, title: link.title }, [`${LTI}custom`]: link.custom, [AGS_CLAIM]: this.ags.claim(link.resourceLinkId) };
  }

  /**
   * An id_token (Security Framework 1.0, 5.1.1.3 and 5.1.2) signed with this platform's key: iss, sub,
   * aud our client id, iat now, exp in 5 minutes; a resource link launch unless `deepLinking`;
   * `change` alters claims or the times for a test.
   */
  async idToken(
    user: PlatformUser,
    nonce: string,
    change: { deepLinking?: boolean; claims?: Record<string, unknown>; iat?: number; exp?: number; iss?: string; aud?: string | string[]; key?: CryptoKey } = {},
  ): Promise<string> {
    const now = Math.floor(Date.now() / 1000);
    const claims = change.deepLinking ? this.deepLinkingClaims(user, nonce) : this.launchClaims(user, nonce);
    return new SignJWT({ ...claims, ...change.claims })
      .setProtectedHeader({ alg: 'RS256', kid: this.key.kid, typ: 'JWT' })
      .setIssuer(change.iss ?? this.issuer)
      .setSubject(user.sub)
      .setAudience(change.aud ?? this.clientId)
      .setIssuedAt(change.iat ?? now)
      .setExpirationTime(change.exp ?? now + 300)
      .sign(change.key ?? this.key.privateKey);
  }

  get membershipsUrl(): string {
    return `${this.base}/memberships`;
  }

  /**
   * The context's members (NRPS 2.0), listed `pageSize` to a page; `down` answers 503 from the token,
   * membership, line item and score endpoints; `failPage` answers 500 for that page (0-based).
   */
  readonly members: ContextMember[] = [];
  pageSize = 2;
  down = false;
  failPage: number | undefined;
  /** Every token request received, and the client assertions that passed every check. */
  tokenRequests = 0;
  readonly assertions: Record<string, unknown>[] = [];
  /** Each access token issued, with the scopes it was granted. */
  private readonly tokens = new Map<string, ReadonlySet<string>>();
  private readonly seenJti = new Set<string>();

  /** After this many more scores accepted, the scores endpoint answers 503 until this is set again (undefined: never). */
  get failScoresAfter(): number | undefined {
    return this.ags.failScoresAfter;
  }
  set failScoresAfter(count: number | undefined) {
    this.ags.failScoresAfter = count;
  }
  /** Requests that reached the scores endpoint while the platform was up, refused or not. */
  get scoreRequests(): number {
    return this.ags.scoreRequests;
  }
  /** The context's line items (AGS 2.0, 3.2), in the order made. */
  get lineItems(): readonly LineItem[] {
    return this.ags.lineItems;
  }
  /** Per user, the score the platform holds for a line item (by its `id` URL): the one with the latest timestamp. */
  gradebook(lineItemId: string): Map<string, Score> {
    return this.ags.gradebook(lineItemId);
  }

  /**
   * The token endpoint (Security Framework 1.0, 4.1; RFC 7523 client assertion): the client credentials
   * grant, the assertion type named, a non-empty set of the scopes offered (the NRPS one and AGS 2.0's;
   * anything else is invalid_scope, RFC 6749 5.2), granted as asked; the assertion checked with jose
   * against the tool's key set as served (RS256, a kid in the header): iss and sub the client id, aud this token
   * endpoint, iat and exp at most 5 minutes apart, a jti never seen before. Throws on any failing check.
   */
  private async issueToken(body: string): Promise<Answer> {
    this.tokenRequests++;
    const form = new URLSearchParams(body);
    const want = { grant_type: 'client_credentials', client_assertion_type: 'urn:ietf:params:oauth:client-assertion-type:jwt-bearer' };
    for (const [name, value] of Object.entries(want)) if (form.get(name) !== value) throw new Error(`${name} is ${form.get(name)}, not ${value}`);
    const asked = new Set((form.get('scope') ?? '').split(' ').filter(Boolean));
    const unknown = [...asked].filter((scope) => !OFFERED_SCOPES.includes(scope));
    if (asked.size === 0 || unknown.length > 0) {
      const description = asked.size === 0 ? 'no scope asked' : `scope not offered: ${unknown.join(' ')}`;
      return { type: 'application/json', body: JSON.stringify({ error: 'invalid_scope', error_description: description }), status: 400 };
    }
    const assertion = form.get('client_assertion') ?? '';
    const header = decodeProtectedHeader(assertion);
    if (header.alg !== 'RS256' || typeof header.kid !== 'string') throw new Error(`header: alg ${header.alg}, kid ${header.kid}`);
    const keySet = (await (await fetch(this.toolKeySetUrl)).json()) as { keys: JWK[] };
    const { payload } = await jwtVerify(assertion, createLocalJWKSet(keySet), {
      algorithms: ['RS256'],
      issuer: this.clientId,
      subject: this.clientId,
      audience: `${this.base}/token`,
      requiredClaims: ['iat', 'exp', 'jti'],
      maxTokenAge: '5m',
    });
    if (payload.exp! - payload.iat! > 300) throw new Error('the assertion lives longer than 5 minutes');
    if (this.seenJti.has(payload.jti!)) throw new Error('jti seen before');
    this.seenJti.add(payload.jti!);
    this.assertions.push(payload);
    const token = randomBytes(24).toString('base64url');
    this.tokens.set(token, asked);
    return { type: 'application/json', body: JSON.stringify({ access_token: token, token_type: 'Bearer', expires_in: 3600, scope: [...asked].join(' ') }) };
  }

  /**
   * The membership service (NRPS 2.0): a bearer token this platform issued with the NRPS scope, the
   * container's media type accepted; members `pageSize` at a time, the next page named by `Link: <…>; rel="next"`.
   */
  private membership(url: URL, headers: IncomingHttpHeaders, granted: ReadonlySet<string> | undefined): Answer {
    requireScope(granted, [NRPS_SCOPE]);
    if (!String(headers.accept ?? '').includes(NRPS_MEDIA_TYPE)) throw new Error(`accept is ${headers.accept}`);
    const page = Number(url.searchParams.get('page') ?? '0');
    if (page === this.failPage) return { type: 'text/plain', body: 'page failed', status: 500 };
    const members = this.members.slice(page * this.pageSize, (page + 1) * this.pageSize);
    const more = (page + 1) * this.pageSize < this.members.length;
    return {
      type: NRPS_MEDIA_TYPE,
      body: JSON.stringify({ id: url.toString(), context: { id: this.contextId }, members }),
      ...(more ? { headers: { link: `<${this.membershipsUrl}?page=${page + 1}>; rel="next"` } } : {}),
    };
  }

  async close(): Promise<void> {
    await new Promise<void>((resolve) => this.server.close(() => resolve()));
  }
}
