import { randomBytes } from 'node:crypto';
import type { IncomingHttpHeaders } from 'node:http';
import { Refused, requireScope, type Answer } from './answer.ts';

/**
 * The test platform's Assignment and Grade Services (AGS 2.0), written from the specification: the
 * line item service, the score publish service and the result service of one context. Section
 * numbers are from memory. The platform's HTTP server routes `/contexts/…` requests here with the
 * scopes the bearer token was granted.
 */

/** AGS 2.0, 3.1: the launch claim naming the services and scopes offered. */
export const AGS_CLAIM = 'https://purl.imsglobal.org/spec/lti-ags/claim/endpoint';
const SCOPE = 'https://purl.imsglobal.org/spec/lti-ags/scope/';
/** AGS 2.0, 3.2.1, 3.3.1 and 3.4.1: one scope per service; the read-only line item scope allows GET only. */
export const AGS_SCOPES = {
  lineItem: `${SCOPE}lineitem`,
  lineItemReadonly: `${SCOPE}lineitem.readonly`,
  resultReadonly: `${SCOPE}result.readonly`,
  score: `${SCOPE}score`,
} as const;
/** AGS 2.0, 3.2.2, 3.3.2 and 3.4.2: the media types of each service. */
export const AGS_MEDIA_TYPES = {
  lineItem: 'application/vnd.ims.lis.v2.lineitem+json',
  container: 'application/vnd.ims.lis.v2.lineitemcontainer+json',
  score: 'application/vnd.ims.lis.v1.score+json',
  results: 'application/vnd.ims.lis.v2.resultcontainer+json',
} as const;
/** AGS 2.0, 3.4.7 and 3.4.8: the progress values a score may carry. */
const ACTIVITY_PROGRESS = ['Initialized', 'Started', 'InProgress', 'Submitted', 'Completed'];
const GRADING_PROGRESS = ['FullyGraded', 'Pending', 'PendingManual', 'Failed', 'NotReady'];
/** ISO 8601 date and time with an offset; any sub-second precision (AGS 2.0, 3.4.6: the timestamp). */
const ISO_8601 = /^\d{4}-\d{2}-\d{2}T\d{2}:\d{2}:\d{2}(\.\d+)?(Z|[+-]\d{2}:\d{2})$/;

/** A gradebook column (AGS 2.0, 3.2): `id` is its URL, with a query string the tool must keep. */
export interface LineItem {
  id: string;
  scoreMaximum: number;
  label: string;
  resourceId?: string;
  resourceLinkId?: string;
  tag?: string;
  startDateTime?: string;
  endDateTime?: string;
}

/** A score as the tool published it (AGS 2.0, 3.4). */
export interface Score {
  userId: string;
  scoreGiven?: number;
  scoreMaximum?: number;
  comment?: string;
  timestamp: string;
  activityProgress: string;
  gradingProgress: string;
}

const json = (type: string, value: unknown, status = 200): Answer => ({ type, body: JSON.stringify(value), status });

/** The media type of a Content-Type header, without its parameters. */
const mediaType = (header: string | undefined) => (header ?? '').split(';')[0].trim().toLowerCase();

function requireAccept(headers: IncomingHttpHeaders, type: string): void {
  if (!String(headers.accept ?? '').includes(type)) throw new Refused(406, `accept is ${headers.accept}, not ${type}`);
}

function readBody(headers: IncomingHttpHeaders, type: string, body: string): Record<string, unknown> {
  if (mediaType(headers['content-type']) !== type) throw new Refused(415, `content-type is ${headers['content-type']}, not ${type}`);
  let value: unknown;
  try {
    value = JSON.parse(body);
  } catch {
    throw new Refused(400, 'body is not JSON');
  }
  if (typeof value !== 'object' || value === null || Array.isArray(value)) throw new Refused(400, 'body is not a JSON object');
  return value as Record<string, unknown>;
}

function optionalString(body: Record<string, unknown>, field: string): string | undefined {
  const value = body[field];
  if (value !== undefined && typeof value !== 'string') throw new Refused(400, `${field} must be a string`);
  return value;
}

function optionalDate(body: Record<string, unknown>, field: string): string | undefined {
  const value = optionalString(body, field);
  if (value !== undefined && !(ISO_8601.test(value) && Number.isFinite(Date.parse(value)))) throw new Refused(400, `${field} must be an ISO 8601 date and time`);
  return value;
}

const isPositive = (value: unknown): value is number => typeof value === 'number' && Number.isFinite(value) && value > 0;

/**
 * A line item's fields from a tool (AGS 2.0, 3.2.7-3.2.10): scoreMaximum a number greater than 0, a
 * label not blank; resourceId, tag and resourceLinkId strings; start and end ISO 8601. Throws 400.
 */
export function lineItemFields(body: Record<string, unknown>): Omit<LineItem, 'id'> {
  if (!isPositive(body.scoreMaximum)) throw new Refused(400, 'scoreMaximum must be a number greater than 0');
  const label = optionalString(body, 'label');
  if (!label?.trim()) throw new Refused(400, 'label is required and not blank');
  const fields: Omit<LineItem, 'id'> = { scoreMaximum: body.scoreMaximum, label };
  for (const field of ['resourceId', 'resourceLinkId', 'tag'] as const) {
    const value = optionalString(body, field);
    if (value !== undefined) fields[field] = value;
  }
  for (const field of ['startDateTime', 'endDateTime'] as const) {
    const value = optionalDate(body, field);
    if (value !== undefined) fields[field] = value;
  }
  return fields;
}

/** A score's fields (AGS 2.0, 3.4.3-3.4.8); throws 400 naming the field the specification refuses. */
function scoreFields(body: Record<string, unknown>): Score {
  if (typeof body.userId !== 'string' || !body.userId) throw new Refused(400, 'userId must be a non-empty string');
  const timestamp = optionalDate(body, 'timestamp');
  if (timestamp === undefined) throw new Refused(400, 'timestamp is required');
  if (typeof body.activityProgress !== 'string' || !ACTIVITY_PROGRESS.includes(body.activityProgress)) throw new Refused(400, `activityProgress must be one of ${ACTIVITY_PROGRESS.join(', ')}`);
  if (typeof body.gradingProgress !== 'string' || !GRADING_PROGRESS.includes(body.gradingProgress)) throw new Refused(400, `gradingProgress must be one of ${GRADING_PROGRESS.join(', ')}`);
  const score: Score = { userId: body.userId, timestamp, activityProgress: body.activityProgress, gradingProgress: body.gradingProgress };
  if (body.scoreGiven !== undefined) {
    if (typeof body.scoreGiven !== 'number' || !Number.isFinite(body.scoreGiven) || body.scoreGiven < 0) throw new Refused(400, 'scoreGiven must be a number of 0 or more');
    if (body.scoreMaximum === undefined) throw new Refused(400, 'scoreMaximum is required when scoreGiven is present');
    score.scoreGiven = body.scoreGiven;
  }
  if (body.scoreMaximum !== undefined) {
    if (!isPositive(body.scoreMaximum)) throw new Refused(400, 'scoreMaximum must be a number greater than 0');
    score.scoreMaximum = body.scoreMaximum;
  }
  const comment = optionalString(body, 'comment');
  if (comment !== undefined) score.comment = comment;
  return score;
}

export class AgsService {
  /** Every line item of the context, in the order made. */
  readonly lineItems: LineItem[] = [];
  /** Requests to the scores endpoint while the platform was up, refused or not. */
  scoreRequests = 0;
  private readonly scores = new Map<string, Map<string, Score>>();
  private readonly keys = new Map<string, string>();
  private failAfter: number | undefined;
  private acceptedSinceSwitch = 0;

  constructor(
    /** The context's line item container (AGS 2.0, 3.2: the claim's `lineitems`). */
    readonly containerUrl: string,
    private readonly linkExists: (resourceLinkId: string) => boolean,
  ) {}

  /** After this many more scores accepted, the scores endpoint answers 503 until it is set again (undefined: never). */
  get failScoresAfter(): number | undefined {
    return this.failAfter;
  }
  set failScoresAfter(count: number | undefined) {
    this.failAfter = count;
    this.acceptedSinceSwitch = 0;
  }

  /** The endpoint claim (AGS 2.0, 3.1); `lineitem` only when the launched link has exactly one line item bound. */
  claim(resourceLinkId?: string): { scope: string[]; lineitems: string; lineitem?: string } {
    const bound = resourceLinkId === undefined ? [] : this.lineItems.filter((item) => item.resourceLinkId === resourceLinkId);
    return { scope: Object.values(AGS_SCOPES), lineitems: this.containerUrl, ...(bound.length === 1 ? { lineitem: bound[0].id } : {}) };
  }

  /** A new line item; its URL carries a query string of its own, which the score URL must keep (AGS 2.0, 3.4). */
  create(fields: Omit<LineItem, 'id'>): LineItem {
    if (fields.resourceLinkId !== undefined && !this.linkExists(fields.resourceLinkId)) throw new Refused(404, `resourceLinkId ${fields.resourceLinkId} is no link of this context`);
    const key = randomBytes(4).toString('hex');
    const item = { id: `${this.containerUrl}/${this.lineItems.length + 1}?key=${key}`, ...fields };
    this.keys.set(item.id, key);
    this.lineItems.push(item);
    return item;
  }

  /** The latest score of each user for a line item, by its `id` URL. */
  gradebook(lineItemId: string): Map<string, Score> {
    return new Map(this.scores.get(lineItemId));
  }

  /** A request to `/contexts/<context>/lineitems…`, with the scopes of its bearer token (undefined: no valid token). */
  answer(method: string, url: URL, body: string, headers: IncomingHttpHeaders, granted: ReadonlySet<string> | undefined): Answer {
    const container = new URL(this.containerUrl);
    if (url.pathname === container.pathname) return method === 'POST' ? this.post(body, headers, granted) : this.list(url, headers, granted);
    const rest = url.pathname.startsWith(`${container.pathname}/`) ? url.pathname.slice(container.pathname.length) : '';
    const match = /^\/(\d+)(\/scores|\/results)?$/.exec(rest);
    const item = match ? this.lineItems[Number(match[1]) - 1] : undefined;
    // The line item URL's query string is part of its address (AGS 2.0, 3.4: kept after /scores).
    if (!item || url.searchParams.get('key') !== this.keys.get(item.id)) throw new Refused(404, `no line item at ${url.pathname}${url.search}`);
    if (match![2] === '/scores' && method === 'POST') return this.publish(item, body, headers, granted);
    if (match![2] === '/results' && method === 'GET') return this.results(item, url, headers, granted);
    if (match![2] === undefined && method === 'GET') {
      requireScope(granted, [AGS_SCOPES.lineItem, AGS_SCOPES.lineItemReadonly]);
      requireAccept(headers, AGS_MEDIA_TYPES.lineItem);
      return json(AGS_MEDIA_TYPES.lineItem, item);
    }
    throw new Refused(405, `${method} is not allowed here`);
  }

  /** AGS 2.0, 3.2.4: the container, filtered by resource_link_id, resource_id and tag (all that are given). */
  private list(url: URL, headers: IncomingHttpHeaders, granted: ReadonlySet<string> | undefined): Answer {
    requireScope(granted, [AGS_SCOPES.lineItem, AGS_SCOPES.lineItemReadonly]);
    requireAccept(headers, AGS_MEDIA_TYPES.container);
    const filters = { resource_link_id: 'resourceLinkId', resource_id: 'resourceId', tag: 'tag' } as const;
    const items = this.lineItems.filter((item) =>
      Object.entries(filters).every(([parameter, field]) => !url.searchParams.has(parameter) || item[field] === url.searchParams.get(parameter)),
    );
    return json(AGS_MEDIA_TYPES.container, items);
  }

  /** AGS 2.0, 3.2.5: a line item posted to the container is made and answered 201 with its `id`. */
  private post(body: string, headers: IncomingHttpHeaders, granted: ReadonlySet<string> | undefined): Answer {
    requireScope(granted, [AGS_SCOPES.lineItem]);
    return json(AGS_MEDIA_TYPES.lineItem, this.create(lineItemFields(readBody(headers, AGS_MEDIA_TYPES.lineItem, body))), 201);
  }

  /**
   * AGS 2.0, 3.4: a score published; per (line item, user) the platform keeps the one with the latest
   * timestamp and ignores one older than it holds (3.4.6), answering 204 either way. Timestamps are
   * compared to the millisecond (Date.parse); finer digits are accepted but do not order.
   */
  private publish(item: LineItem, body: string, headers: IncomingHttpHeaders, granted: ReadonlySet<string> | undefined): Answer {
    this.scoreRequests++;
    requireScope(granted, [AGS_SCOPES.score]);
    if (this.failAfter !== undefined && this.acceptedSinceSwitch >= this.failAfter) return { type: 'text/plain', body: 'scores unavailable', status: 503 };
    const score = scoreFields(readBody(headers, AGS_MEDIA_TYPES.score, body));
    const book = this.scores.get(item.id) ?? new Map<string, Score>();
    this.scores.set(item.id, book);
    const held = book.get(score.userId);
    if (!held || Date.parse(held.timestamp) <= Date.parse(score.timestamp)) book.set(score.userId, score);
    this.acceptedSinceSwitch++;
    return { type: 'text/plain', body: '', status: 204 };
  }

  /** AGS 2.0, 3.3: each user's result for the line item (`user_id` filters), from the scores held. */
  private results(item: LineItem, url: URL, headers: IncomingHttpHeaders, granted: ReadonlySet<string> | undefined): Answer {
    requireScope(granted, [AGS_SCOPES.resultReadonly]);
    requireAccept(headers, AGS_MEDIA_TYPES.results);
    const userId = url.searchParams.get('user_id');
    const held = [...(this.scores.get(item.id)?.values() ?? [])].filter((score) => userId === null || score.userId === userId);
    return json(
      AGS_MEDIA_TYPES.results,
      held.map((score) => ({
        id: `${url.origin}${url.pathname}/${encodeURIComponent(score.userId)}`,
        scoreOf: item.id,
        userId: score.userId,
        ...(score.scoreGiven === undefined ? {} : { resultScore: score.scoreGiven, resultMaximum: score.scoreMaximum }),
        ...(score.comment === undefined ? {} : { comment: score.comment }),
      })),
    );
  }
}
