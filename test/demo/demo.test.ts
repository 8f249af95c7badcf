import { mkdtemp, readdir, readFile, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { buildApp } from '../../server/app.ts';
import { runDemo } from '../../server/demo/run-demo.ts';
import { openStore } from '../../server/store/connection.ts';
import { folded, pdfText } from '../support/pdf-reading.ts';

// Each file is named as the service names its download: course, section, assignment (each cut after a
// whole word within 60 characters), then what it is. Written by hand from the demo's names.
const PLACE = 'Kinetics_laboratory_invented-Demo_section-Acid-catalysed_first-order_kinetics_invented_scenario_HCl';
const SECOND_PLACE = 'Kinetics_laboratory_invented-Demo_section-Activation_energy_from_rate_constants_at_six_temperatures';
const THIRD_PLACE = 'Kinetics_laboratory_invented-Demo_section-Order_of_the_fading_of_Corvane_violet_invented_scenario';
const sheetName = (place: string) => new RegExp(`^${place}-B-\\d\\d-v1-feedback\\.pdf$`);
const sheetOf = (place: string, id: string) => `${place}-${id}-v1-feedback.pdf`;

describe('npm run demo', () => {
  let dir: string;
  const lines: string[] = [];

  beforeAll(async () => {
    dir = await mkdtemp(join(tmpdir(), 'rateproof-demo-'));
    await runDemo(join(dir, 'out'), (l) => lines.push(l));
  }, 120_000);
  afterAll(async () => rm(dir, { recursive: true, force: true }));

  it('writes a feedback sheet for each of 24 pseudonymous students, the summary and the gradebook', async () => {
    const files = await readdir(join(dir, 'out'));
    const sheets = files.filter((f) => sheetName(PLACE).test(f));
    expect(sheets).toHaveLength(24);
    expect(files).toEqual(expect.arrayContaining([`${PLACE}-summary.pdf`, `${PLACE}-gradebook.csv`, 'database']));
    const gradebook = await readFile(join(dir, 'out', `${PLACE}-gradebook.csv`), 'utf8');
    expect(gradebook.split('\r\n').filter((l) => l !== '')).toHaveLength(25);
  });

  it('labels the invented data in the PDF footer', async () => {
    const text = folded(await pdfText(await readFile(join(dir, 'out', sheetOf(PLACE, 'B-05')))));
    expect(text).toContain('demonstration data: generated, not measured');
    expect(text).toContain('B-05');
  });

  // The first table is the first assignment's; each other kind's follows its heading.
  const second = () => lines.findIndex((l) => l.trim().startsWith('Second assignment'));
  const third = () => lines.findIndex((l) => l.trim().startsWith('Third assignment'));

  it('gives about a third of the section one or two slips, and finds them', () => {
    const rows = lines.slice(0, second()).filter((l) => /^B-\d\d /.test(l));
    expect(rows).toHaveLength(24);
    const withSlips = rows.filter((l) => !/ - +-$/.test(l) && !/^B-\d\d +\S+ +- /.test(l));
    expect(withSlips.length).toBe(8);
    // The first code made is among the codes found, for every student who made slips.
    for (const row of withSlips) {
      const [, made, found] = /^B-\d\d +\S+ +(\S+?),? .*?((?:[a-z-]+(?:, )?)+)$/.exec(row) ?? [];
      expect(found, row).toContain(made.replace(/,$/, ''));
    }
  });

  it('adds a second assignment of the kind temperature-dependence: every third student with one slip, each found, and its documents', async () => {
    const rows = lines.slice(second(), third()).filter((l) => /^B-\d\d /.test(l));
    expect(rows).toHaveLength(24);
    const withSlips = rows.filter((l) => !/^B-\d\d +\S+ +- /.test(l));
    expect(withSlips).toHaveLength(8);
    for (const row of withSlips) {
      const [, made, found] = /^B-\d\d +\S+ +(\S+) +(.*)$/.exec(row) ?? [];
      expect(found.split(', '), row).toContain(made);
    }
    const files = await readdir(join(dir, 'out', 'temperature-dependence'));
    expect(files.filter((f) => sheetName(SECOND_PLACE).test(f))).toHaveLength(24);
    expect(files).toEqual(expect.arrayContaining([`${SECOND_PLACE}-summary.pdf`, `${SECOND_PLACE}-gradebook.csv`]));
  });

  it('adds a third assignment of the kind reaction-order: every second student with one slip, each charged one found, the 2A → P convention uncharged, and its documents', async () => {
    const rows = lines.slice(third()).filter((l) => /^B-\d\d /.test(l));
    expect(rows).toHaveLength(24);
    const withSlips = rows.filter((l) => !/^B-\d\d +\S+ +- /.test(l));
    expect(withSlips).toHaveLength(12);
    for (const row of withSlips) {
      const [, score, made, found] = /^B-\d\d +(\S+) +(\S+) +(.*)$/.exec(row) ?? [];
      // k written for the rate of 2A → P (half the loss rate's) is a convention, accepted with a note.
      if (made === 'stoichiometric-k') expect(score, row).toBe('8/8');
      else expect(found.split(', '), row).toContain(made);
    }
    const files = await readdir(join(dir, 'out', 'reaction-order'));
    expect(files.filter((f) => sheetName(THIRD_PLACE).test(f))).toHaveLength(24);
    expect(files).toEqual(expect.arrayContaining([`${THIRD_PLACE}-summary.pdf`, `${THIRD_PLACE}-gradebook.csv`]));
  });

  it('prints each slip of a sheet once, places in words and numbers whole', async () => {
    const sheets = async (sub: string) => (await readdir(join(dir, 'out', sub))).filter((f) => /-B-\d\d-v1-feedback\.pdf$/.test(f)).map((f) => join(dir, 'out', sub, f));
    // One at a time: pdf.js serves one document at once reliably.
    for (const file of [...(await sheets('')), ...(await sheets('temperature-dependence')), ...(await sheets('reaction-order'))]) {
      const text = await pdfText(await readFile(file));
      // The checker's paths (`runs[0].reported.k`) stay in the JSON.
      expect(folded(text)).not.toMatch(/runs\[|points\[|reported\.[A-Za-z]/);
      // No number broken across lines: none ends in ± or ×, none starts with one or with a power of ten.
      for (const line of text.split(/\n|\f/)) expect(line).not.toMatch(/[±×]\s*$|^\s*([±×] |10[⁻⁰¹²³⁴⁵⁶⁷⁸⁹])/);
    }
    // B-17 made two slips (the demo's table says which): a time unit in every run, and a wrong end value
    // in one. Each is one card; the time unit's other seven places are listed under its first.
    const b17 = folded(await pdfText(await readFile(join(dir, 'out', sheetOf(PLACE, 'B-17')))));
    expect(lines.find((l) => l.startsWith('B-17'))).toMatch(/time-unit, wrong-infinity/);
    expect(b17.match(/time-unit/g)).toHaveLength(1);
    expect(b17).toMatch(/Error · Run “[^”]+”, kobs and 7 more places/);
    expect(b17).toContain('2 findings cost points');
    expect(b17).not.toContain('Counted once');
  });

  it('ends with an instructor token and a TA token, each opening what it says on the demo database', async () => {
    const token = (who: string) => new RegExp(`^${who} token \\(demo-[a-z]+\\): (\\S+)$`).exec(lines.find((l) => l.startsWith(`${who} token`)) ?? '')?.[1];
    const [instructor, ta] = [token('instructor'), token('TA')];
    expect(instructor).toBeDefined();
    expect(ta).toBeDefined();
    const store = openStore({ dataDir: join(dir, 'out', 'database') });
    const app = await buildApp({ config: { dataDir: join(dir, 'out', 'database'), host: '127.0.0.1', port: 0, bodyLimitBytes: 1 << 20, logLevel: 'silent' }, store });
    try {
      const me = async (t: string) => (await app.inject({ method: 'GET', url: '/v1/me', headers: { authorization: `Bearer ${t}` } })).json();
      const [asInstructor, asTa] = [await me(instructor!), await me(ta!)];
      expect([asInstructor.role, asTa.role]).toEqual(['instructor', 'ta']);
      // The TA opens the section's results for every assignment; the instructor the course page as well.
      const [course] = asTa.courses;
      expect(course.assignments).toHaveLength(3);
      for (const a of course.assignments) {
        const results = await app.inject({ method: 'GET', url: `/v1/sections/${course.sections[0].id}/assignments/${a.id}/results`, headers: { authorization: `Bearer ${ta}` } });
        expect(results.statusCode).toBe(200);
      }
      const staff = (t: string) => app.inject({ method: 'GET', url: `/v1/courses/${course.id}/staff`, headers: { authorization: `Bearer ${t}` } });
      expect([(await staff(instructor!)).statusCode, (await staff(ta!)).statusCode]).toEqual([200, 403]);
    } finally {
      await app.close();
      await store.close();
    }
  });
});
