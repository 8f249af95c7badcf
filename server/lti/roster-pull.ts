import type { Kysely } from 'kysely';
import { ApiError } from '../errors.ts';
import type { Database } from '../store/database.ts';
import { contextsOfSection, platformStudents } from '../store/lti-contexts.ts';
import { getPlatform } from '../store/lti-platforms.ts';
import { launchedStudent } from '../store/lti-users.ts';
import { revokeAccessCodes } from '../store/student-access.ts';
import { setEnrolment } from '../store/students.ts';
import { launchedRole } from './claims.ts';
import { fetchMembers, MEMBERSHIP_SCOPE } from './memberships.ts';
import { serviceToken } from './service-token.ts';

export interface RosterPulled {
  enrolled: number;
  withdrawn: number;
  unchanged: number;
}

/** The one platform context placed on a section with a membership URL; a 409 saying what is missing otherwise. */
async function sourceOf(db: Kysely<Database>, sectionId: number) {
  const contexts = await contextsOfSection(db, sectionId);
  if (contexts.length === 0) throw new ApiError('conflict', "no platform's resource link is placed on this section");
  if (contexts.length > 1) throw new ApiError('conflict', 'resource links of several platform contexts are placed on this section: a pull would not know whose roster it is');
  const [{ platformId, contextId, membershipsUrl }] = contexts;
  if (!membershipsUrl) throw new ApiError('conflict', "the platform has not sent this context's membership service yet: an instructor or TA launches from it first");
  return { platform: (await getPlatform(db, platformId))!, contextId, membershipsUrl };
}

/** What a pull read from the platform, before anything is written. */
export interface RosterRead {
  platform: NonNullable<Awaited<ReturnType<typeof getPlatform>>>;
  members: Awaited<ReturnType<typeof fetchMembers>>;
}

/**
 * A section's membership read from its platform context (NRPS 2.0), whole, before any transaction
 * opens: the platform may fetch our key set to check the token request's assertion while we wait, and
 * on the embedded engine (one connection) a transaction held open meanwhile would keep that request
 * waiting until both time out.
 */
export async function readRoster(db: Kysely<Database>, sectionId: number): Promise<RosterRead> {
  const { platform, membershipsUrl } = await sourceOf(db, sectionId);
  return { platform, members: await fetchMembers(membershipsUrl, await serviceToken(db, platform, [MEMBERSHIP_SCOPE])) };
}

/**
 * A section's roster pulled from its platform context (NRPS 2.0). Members whose context role is
 * Learner (mapped as a launch maps it) and whose status is Active are enrolled, made as a launched
 * learner is (`lti-<n>`, display name only) or enrolled again when a pull had withdrawn them; a
 * student this platform made in this section who is no longer listed, or listed Inactive, is
 * withdrawn, the change recorded and their access codes revoked as the roster routes do. Students
 * added by hand, students the platform placed in another section, and those removed by staff are
 * left alone. The membership was read whole first (`readRoster`), so a platform failing part way stores nothing.
 */
export async function applyRoster(db: Kysely<Database>, section: { id: number; courseId: number }, staffId: number | null, { platform, members }: RosterRead): Promise<RosterPulled> {
  // NRPS 2.0: status is Active when absent; a member listed twice counts once.
  const learners = new Map(members.filter((m) => (m.status ?? 'Active') === 'Active' && launchedRole(m.roles) === 'student').map((m) => [m.user_id, m]));
  const before = await platformStudents(db, platform.id);
  const counts: RosterPulled = { enrolled: 0, withdrawn: 0, unchanged: 0 };
  for (const [sub, member] of learners) {
    const known = before.get(sub);
    if (known && (known.sectionId !== section.id || known.status !== 'withdrawn')) {
      counts.unchanged++;
    } else if (known) {
      await setEnrolment(db, section.id, known.studentId, 'enrolled', staffId);
      counts.enrolled++;
    } else {
      await launchedStudent(db, { platformId: platform.id, courseId: section.courseId, sub, displayName: member.name?.slice(0, 200) ?? null, roles: member.roles }, section.id, staffId);
      counts.enrolled++;
    }
  }
  const gone = [...before].filter(([sub, s]) => s.sectionId === section.id && s.status === 'enrolled' && !learners.has(sub)).map(([, s]) => s);
  for (const student of gone) await setEnrolment(db, section.id, student.studentId, 'withdrawn', staffId);
  await revokeAccessCodes(db, gone.map((s) => s.rowId));
  counts.withdrawn = gone.length;
  return counts;
}
