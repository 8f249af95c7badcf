import type { RouteSpec } from '../http/route-table.ts';
import { accessCodeRoutes } from './access-codes.ts';
import { assignmentRoutes } from './assignments.ts';
import { courseRoutes } from './courses.ts';
import { deadlineRoutes } from './deadlines.ts';
import { kindRoutes } from './kinds.ts';
import { ltiLaunchRoutes } from './lti-launch.ts';
import { ltiPlatformRoutes } from './lti-platforms.ts';
import { ltiRosterRoutes } from './lti-roster.ts';
import { meRoutes } from './me.ts';
import { reportRoutes } from './reports.ts';
import { resultRoutes } from './results.ts';
import { rosterRoutes } from './rosters.ts';
import { sessionRoutes } from './sessions.ts';
import { signalRoutes } from './signals.ts';
import { studentPageRoutes } from './student-pages.ts';
import { studentSessionRoutes } from './student-session.ts';
import { submissionDisplayRoutes } from './submission-display.ts';
import { submissionRoutes } from './submissions.ts';

/** Every route of the API, registered explicitly in this order; a new resource's routes are one more spread. */
export const routes: RouteSpec[] = [
  ...sessionRoutes,
  ...studentSessionRoutes,
  ...meRoutes,
  ...kindRoutes,
  ...courseRoutes,
  ...rosterRoutes,
  ...accessCodeRoutes,
  ...assignmentRoutes,
  ...submissionRoutes,
  ...submissionDisplayRoutes,
  ...resultRoutes,
  ...deadlineRoutes,
  ...signalRoutes,
  ...reportRoutes,
  ...studentPageRoutes,
  ...ltiPlatformRoutes,
  ...ltiLaunchRoutes,
  ...ltiRosterRoutes,
];
