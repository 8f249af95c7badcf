import { assignmentRoutes } from './assignments.ts';
import { courseRoutes } from './courses.ts';
import { meRoutes } from './me.ts';
import { reportRoutes } from './reports.ts';
import { resultRoutes } from './results.ts';
import { signalRoutes } from './signals.ts';
import { rosterRoutes } from './rosters.ts';
import type { RouteSpec } from './route-spec.ts';
import { submissionDisplayRoutes } from './submission-display.ts';
import { submissionRoutes } from './submissions.ts';

/** Every route of the API, registered explicitly in this order. */
export const routes: RouteSpec[] = [...meRoutes, ...courseRoutes, ...rosterRoutes, ...assignmentRoutes, ...submissionRoutes, ...submissionDisplayRoutes, ...resultRoutes, ...signalRoutes, ...reportRoutes];
