import type { Migration } from 'kysely';
import * as initial from './2026-12-02T1000-initial.ts';
import * as sessions from './2026-12-02T2100-sessions.ts';
import * as rosterStatus from './2026-12-02T2200-roster-status.ts';
import * as signalChoices from './2026-12-02T2330-signal-choices.ts';
import * as releases from './2026-12-05T1000-releases.ts';
import * as studentIdCase from './2026-12-05T1100-student-id-case.ts';
import * as overrideReasonShown from './2026-12-05T1200-override-reason-shown.ts';
import * as latestResults from './2026-12-05T1400-latest-results.ts';
import * as regrades from './2026-12-05T1600-regrades.ts';
import * as sectionFiles from './2026-12-05T1800-section-files.ts';
import * as studentDoor from './2026-12-05T2000-student-door.ts';
import * as ltiLaunch from './2026-12-05T2100-lti-launch.ts';
import * as pageSummaries from './2026-12-05T2100-page-summaries.ts';
import * as ltiContexts from './2026-12-05T2300-lti-contexts.ts';
import * as ltiGrades from './2026-12-05T2330-lti-grades.ts';
import * as ltiDeepLinks from './2026-12-05T2200-lti-deep-links.ts';

/**
 * Every migration by name, applied in name order (names start with a timestamp). A static list rather
 * than a folder scan, so that the compiled build finds the same migrations as the sources do; a test
 * holds the list to the files in this folder.
 */
export const migrations: Record<string, Migration> = {
  '2026-12-02T1000-initial': initial,
  '2026-12-02T2100-sessions': sessions,
  '2026-12-02T2200-roster-status': rosterStatus,
  '2026-12-02T2330-signal-choices': signalChoices,
  '2026-12-05T1000-releases': releases,
  '2026-12-05T1100-student-id-case': studentIdCase,
  '2026-12-05T1200-override-reason-shown': overrideReasonShown,
  '2026-12-05T1400-latest-results': latestResults,
  '2026-12-05T1600-regrades': regrades,
  '2026-12-05T1800-section-files': sectionFiles,
  '2026-12-05T2000-student-door': studentDoor,
  '2026-12-05T2100-lti-launch': ltiLaunch,
  '2026-12-05T2100-page-summaries': pageSummaries,
  '2026-12-05T2200-lti-deep-links': ltiDeepLinks,
  '2026-12-05T2300-lti-contexts': ltiContexts,
  '2026-12-05T2330-lti-grades': ltiGrades,
};
