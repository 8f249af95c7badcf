import { join } from 'node:path';
import type { Kysely } from 'kysely';
import type { Database } from '../../../server/store/database.ts';
import { tableRows } from '../../../server/demo/demo-table.ts';
import { writeSectionDocuments } from '../../../server/demo/section-documents.ts';
import { seededRandom } from '../../../server/demo/seeded-random.ts';
import { temperatureSlips, temperatureSubmission } from './submission-generator.ts';

type Api = (method: 'GET' | 'POST', url: string, token: string, payload?: unknown) => Promise<{ id: number }>;

/**
 * The demo's second assignment, of the kind `temperature-dependence`: every student hands in rate
 * constants at six temperatures (invented), every third with one slip. Sheets, summary and gradebook
 * go to `<outDir>/temperature-dependence/`. Returns a line per student for the demo's table.
 */
export async function temperatureDemo(
  api: Api,
  db: Kysely<Database>,
  place: { courseId: number; courseName: string; sectionId: number; sectionName: string; instructorToken: string; taToken: string; ids: string[] },
  outDir: string,
): Promise<string[]> {
  const title = 'Activation energy from rate constants at six temperatures (invented scenario)';
  const assignment = await api('POST', `/v1/courses/${place.courseId}/assignments`, place.instructorToken, { title, settings: { kind: 'temperature-dependence' } });
  const random = seededRandom(20261203);
  const made = new Map<string, string[]>();
  const submissions = place.ids.map((id, i) => {
    const slip = i % 3 === 2 ? temperatureSlips[Math.floor(i / 3) % temperatureSlips.length] : undefined;
    if (slip) made.set(id, [slip]);
    return temperatureSubmission(random, id, slip);
  });
  await api('POST', `/v1/sections/${place.sectionId}/assignments/${assignment.id}/submissions`, place.taToken, submissions);

  const inputs = await writeSectionDocuments(db, { courseName: place.courseName, sectionName: place.sectionName, sectionId: place.sectionId, assignmentId: assignment.id, title }, join(outDir, 'temperature-dependence'));
  return tableRows(inputs.map((i) => i.result), (id) => made.get(id) ?? []);
}
