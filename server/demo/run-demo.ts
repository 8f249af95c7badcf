import { randomBytes } from 'node:crypto';
import { mkdir, rm } from 'node:fs/promises';
import { join } from 'node:path';
import { kindDemos } from '../../kinds/registry.ts';
import { INVENTED_NOTE } from '../../reports/feedback-input.ts';
import { buildApp } from '../app.ts';
import type { Config } from '../config.ts';
import { openStore } from '../store/connection.ts';
import { migrateToLatest } from '../store/migrate.ts';
import { TABLE_HEADER, tableRows } from './demo-table.ts';
import { writeSectionDocuments } from './section-documents.ts';

/**
 * `npm run demo`: an invented course with one section of 24 pseudonymous students, graded through the
 * API on the embedded database: an assignment of every kind that gives a demo (kinds/<kind>/index.ts),
 * each with every feedback sheet, the summary and the gradebook written to ./demo-output (the first
 * kind's) or ./demo-output/<kind>/ (the others'). Everything here is generated: no measurement, no real student.
 */
const STUDENTS = 24;

/** How the printout names the assignments after the first. */
const ORDINALS = ['First', 'Second', 'Third', 'Fourth', 'Fifth', 'Sixth', 'Seventh', 'Eighth'];
const ordinal = (i: number) => ORDINALS[i] ?? `Number ${i + 1}`;

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
    const course = await api('POST', '/v1/courses', admin, { name: 'Kinetics laboratory (invented)' });
    const instructor = await api('POST', `/v1/courses/${course.id}/staff`, admin, { handle: 'demo-instructor', role: 'instructor' });
    const instructorToken = (await api('POST', `/v1/staff/${instructor.id}/tokens`, admin)).token as string;
    const section = await api('POST', `/v1/courses/${course.id}/sections`, instructorToken, { name: 'Demo section' });
    const ta = await api('POST', `/v1/courses/${course.id}/staff`, instructorToken, { handle: 'demo-ta', role: 'ta', sectionIds: [section.id] });
    const taToken = (await api('POST', `/v1/staff/${ta.id}/tokens`, instructorToken)).token as string;
    const ids = Array.from({ length: STUDENTS }, (_, i) => `B-${String(i + 1).padStart(2, '0')}`);
    await api('POST', `/v1/sections/${section.id}/roster`, instructorToken, { students: ids.map((studentId) => ({ studentId })) });

    const graded = [];
    for (const [i, { kind, demo }] of (await kindDemos()).entries()) {
      const assignment = await api('POST', `/v1/courses/${course.id}/assignments`, instructorToken, { title: demo.title, settings: demo.settings });
      const { submissions, slipped } = demo.section(ids);
      await api('POST', `/v1/sections/${section.id}/assignments/${assignment.id}/submissions`, taToken, submissions);
      const dir = i === 0 ? outDir : join(outDir, kind);
      const written = await writeSectionDocuments(store.db, { courseName: course.name, sectionName: section.name, sectionId: section.id, assignmentId: assignment.id, title: demo.title }, dir);
      graded.push({ kind, about: demo.about, dir, ...written, slipped });
    }

    write(`${INVENTED_NOTE}`);
    for (const [i, { kind, about, inputs, slipped }] of graded.entries()) {
      if (i > 0) write(`\n${ordinal(i)} assignment (${kind}): ${about}`);
      write(TABLE_HEADER);
      for (const row of tableRows(inputs.map((x) => x.result), (id) => slipped.get(id) ?? [])) write(row);
      for (const input of inputs) {
        const signals = input.result.signals ?? [];
        if (signals.length) write(`signals for review, ${input.result.studentId}: ${signals.map((x) => `${x.code} (${x.path})`).join(', ')}`);
      }
    }
    const [first, ...others] = graded;
    const elsewhere = others.map((g, i) => `, and those of the ${ordinal(i + 1).toLowerCase()} assignment to ${g.dir}/`).join('');
    write(`\nwrote ${first?.inputs.length ?? 0} feedback sheets (…-<student id>-v<version>-feedback.pdf), ${first?.summary} and ${first?.gradebook} to ${outDir}/${elsewhere}`);
    write(`the demo database stays in ${dataDir}. To open the workspace on it:`);
    write(`  RATEPROOF_DATA_DIR=${dataDir} npm start   then open http://127.0.0.1:3000/ and sign in with one of these tokens:`);
    write(`instructor token (demo-instructor): ${instructorToken}`);
    write(`  opens the course page (assignments, settings, rosters, staff and their tokens) and every section's results, students and downloads`);
    write(`TA token (demo-ta): ${taToken}`);
    write(`  opens the results of ${section.name} for ${graded.length === 2 ? 'both assignments' : `all ${graded.length} assignments`}, each student's page (findings, overrides, release) and the downloads; not the course page`);
  } finally {
    await app.close();
    await store.close();
  }
}

