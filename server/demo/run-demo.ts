import { randomBytes } from 'node:crypto';
import { mkdir, rm } from 'node:fs/promises';
import { join } from 'node:path';
import type { Submission } from '../../kinds/first-order-catalysis/schemas.ts';
import { INVENTED_NOTE } from '../../reports/feedback-input.ts';
import { buildApp } from '../app.ts';
import type { Config } from '../config.ts';
import { openStore } from '../store/connection.ts';
import { migrateToLatest } from '../store/migrate.ts';
import { seededRandom } from './seeded-random.ts';
import { TABLE_HEADER, tableRows } from './demo-table.ts';
import { generateSection } from '../../kinds/first-order-catalysis/demo/generated-section.ts';
import { writeSectionDocuments } from './section-documents.ts';
import { temperatureDemo } from '../../kinds/temperature-dependence/demo/demo-assignment.ts';
import { assignmentSettings, generateAssignment } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';

/**
 * `npm run demo`: an invented course with one section of 24 pseudonymous students, graded through the
 * API on the embedded database, with every feedback sheet, the summary and the gradebook written to
 * ./demo-output. Everything here is generated: no measurement, no real student.
 */
const STUDENTS = 24;

export async function runDemo(outDir = 'demo-output', write: (line: string) => void = (l) => process.stdout.write(`${l}\n`)): Promise<void> {
  await rm(outDir, { recursive: true, force: true });
  await mkdir(outDir, { recursive: true });
  const dataDir = join(outDir, 'database');
  const store = openStore({ dataDir });
  await migrateToLatest(store.db);
  const admin = randomBytes(24).toString('base64url');
  const config: Config = { dataDir, host: '127.0.0.1', port: 0, adminToken: admin, bodyLimitBytes: 20 * 1024 * 1024, logLevel: 'silent' };
  const app = await buildApp({ config, store });
  const api = async (method: 'GET' | 'POST', url: string, token: string, payload?: unknown) => {
    const res = await app.inject({ method, url, headers: { authorization: `Bearer ${token}` }, ...(payload === undefined ? {} : { payload: payload as object }) });
    if (res.statusCode >= 300) throw new Error(`${method} ${url}: ${res.statusCode} ${res.body}`);
    return res.json();
  };
  try {
    const random = seededRandom(20261202);
    const options = { fitModel: 'origin' as const, reference: true, equilibrium: true };
    const course = await api('POST', '/v1/courses', admin, { name: 'Kinetics laboratory (invented)' });
    const instructor = await api('POST', `/v1/courses/${course.id}/staff`, admin, { handle: 'demo-instructor', role: 'instructor' });
    const instructorToken = (await api('POST', `/v1/staff/${instructor.id}/tokens`, admin)).token as string;
    const section = await api('POST', `/v1/courses/${course.id}/sections`, instructorToken, { name: 'Demo section' });
    const ta = await api('POST', `/v1/courses/${course.id}/staff`, instructorToken, { handle: 'demo-ta', role: 'ta', sectionIds: [section.id] });
    const taToken = (await api('POST', `/v1/staff/${ta.id}/tokens`, instructorToken)).token as string;
    const ids = Array.from({ length: STUDENTS }, (_, i) => `B-${String(i + 1).padStart(2, '0')}`);
    await api('POST', `/v1/sections/${section.id}/roster`, instructorToken, { students: ids.map((studentId) => ({ studentId })) });
    const assignment = await api('POST', `/v1/courses/${course.id}/assignments`, instructorToken, {
      title: 'Acid-catalysed first-order kinetics (invented scenario: HCl 0.05 to 0.40 M)',
      settings: assignmentSettings(options),
    });

    const settings = generateAssignment(random, options);
    const { submissions, slipped } = generateSection(random, settings, ids);
    recordTemperatures(submissions);
    await api('POST', `/v1/sections/${section.id}/assignments/${assignment.id}/submissions`, taToken, submissions);

    const inputs = await writeSectionDocuments(store.db, { courseName: course.name, sectionName: section.name, sectionId: section.id, assignmentId: assignment.id, title: assignment.title }, outDir);
    const place = { courseId: course.id, courseName: course.name, sectionId: section.id, sectionName: section.name, instructorToken, taToken, ids };
    const secondKind = await temperatureDemo(api, store.db, place, outDir);

    write(`${INVENTED_NOTE}`);
    write(TABLE_HEADER);
    for (const row of tableRows(inputs.map((i) => i.result), (id) => slipped.get(id) ?? [])) write(row);
    for (const input of inputs) {
      const signals = input.result.signals ?? [];
      if (signals.length) write(`signals for review, ${input.result.studentId}: ${signals.map((x) => `${x.code} (${x.path})`).join(', ')}`);
    }
    write(`\nSecond assignment (temperature-dependence): activation energy from rate constants at six temperatures`);
    write(TABLE_HEADER);
    for (const row of secondKind) write(row);
    write(`\nwrote ${inputs.length} feedback sheets, summary.pdf and gradebook.csv to ${outDir}/, and those of the second assignment to ${outDir}/temperature-dependence/`);
    write(`the demo database stays in ${dataDir}. To open the workspace on it:`);
    write(`  RATEPROOF_DATA_DIR=${dataDir} npm start   then open http://127.0.0.1:3000/ and sign in with one of these tokens:`);
    write(`instructor token (demo-instructor): ${instructorToken}`);
    write(`  opens the course page (assignments, settings, rosters, staff and their tokens) and every section's results, students and downloads`);
    write(`TA token (demo-ta): ${taToken}`);
    write(`  opens the results of ${section.name} for both assignments, each student's page (findings, overrides, release) and the downloads; not the course page`);
  } finally {
    await app.close();
    await store.close();
  }
}

/**
 * Each run records the room's temperature, 24.6 to 25.4 degC (invented); one student measured a run
 * on a warmer afternoon, 27.2 degC, which the workspace shows as a signal for review.
 */
function recordTemperatures(submissions: Submission[]): void {
  const random = seededRandom(25);
  for (const s of submissions) for (const run of s.runs) run.temperatureC = Number((24.6 + 0.8 * random()).toFixed(1));
  submissions[7].runs[2].temperatureC = 27.2;
}
