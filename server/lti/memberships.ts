import { z } from 'zod';
import { askPlatform, platformFailed } from './service-token.ts';

/** NRPS 2.0: the scope a roster read asks for, and the media type of a membership container. */
export const MEMBERSHIP_SCOPE = 'https://purl.imsglobal.org/spec/lti-nrps/scope/contextmembership.readonly';
const MEMBERSHIP_MEDIA_TYPE = 'application/vnd.ims.lti-nrps.v2.membershipcontainer+json';
/** A roster longer than this many pages is refused rather than followed for ever (common practice, no source). */
const MAX_PAGES = 200;

/** A member as NRPS 2.0 lists them; only what a roster needs is read (status is Active when absent). */
const Member = z.object({
  user_id: z.string().min(1).max(255),
  roles: z.array(z.string()),
  status: z.string().optional(),
  name: z.string().optional(),
});
export type Member = z.infer<typeof Member>;
const Container = z.object({ members: z.array(Member) });

/** The `rel="next"` URL of a Link header (RFC 8288), if any. */
export function nextPage(link: string | null): string | undefined {
  for (const part of link?.split(',') ?? []) {
    const match = /^\s*<([^>]+)>\s*;(.*)$/.exec(part);
    if (match && /(^|;)\s*rel\s*=\s*"?next"?\s*(;|$)/i.test(match[2])) return match[1];
  }
  return undefined;
}

/**
 * Every member of a context (NRPS 2.0, membership service): the container at the context's
 * membership URL and each page its `Link: <…>; rel="next"` header names. Read whole before anything
 * is stored, so a failing page changes nothing.
 */
export async function fetchMembers(url: string, token: string): Promise<Member[]> {
  const members: Member[] = [];
  let next: string | undefined = url;
  for (let page = 0; next !== undefined; page++) {
    if (page === MAX_PAGES) throw platformFailed('membership service', `more than ${MAX_PAGES} pages`);
    const response = await askPlatform('membership service', next, { headers: { accept: MEMBERSHIP_MEDIA_TYPE, authorization: `Bearer ${token}` } });
    const body = Container.safeParse(await response.json().catch(() => undefined));
    if (!body.success) throw platformFailed('membership service', 'not a membership container');
    members.push(...body.data.members);
    const link = nextPage(response.headers.get('link'));
    next = link === undefined ? undefined : new URL(link, next).toString();
  }
  return members;
}
