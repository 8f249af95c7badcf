import { buffer } from 'node:stream/consumers';
import { describe, expect, it } from 'vitest';
import { sectionZip, type ZipEntry } from '../../reports/section-zip.ts';
import { feedbackSheet } from '../../kinds/documents.ts';
import { feedbackInput, section } from './fixtures.ts';
import { unzip } from '../support/zip-entries.ts';

// Invented places; each entry's header names it.
const header = (studentId: string, course = 'Kinetics lab', version = 1) => ({ course, section: 'Thursday B', assignment: 'Mutarotation', studentId, version, gradedAt: '2025-03-04T14:30:00Z' });
const entry = (studentId: string, pdf: Buffer, course?: string) => ({ input: { header: header(studentId, course) }, pdf });

describe('sectionZip', () => {
  it('holds one feedback PDF per student, named for what it is, from an async source', async () => {
    const s = section(3, [undefined, 'log-base', 'sign-flipped']);
    async function* sheets(): AsyncGenerator<ZipEntry> {
      for (const student of s.students) {
        const input = feedbackInput(s.settings, student);
        yield { input, pdf: await feedbackSheet(input) };
      }
    }
    const entries = await unzip(await buffer(sectionZip(sheets())));
    // Hand-written from the fixture's header: course, section, assignment, id, version, then what it is.
    expect(entries.map((e) => e.name)).toEqual([1, 2, 3].map((n) => `Kinetics_laboratory_invented-Thursday_B-Mutarotation_kinetics-S-00${n}-v1-feedback.pdf`));
    for (const e of entries) expect(e.data.subarray(0, 5).toString()).toBe('%PDF-');
  });

  it('takes a plain iterable, keeps names safe and unique', async () => {
    const pdf = Buffer.from('%PDF-1.3 not really\n');
    const entries = await unzip(await buffer(sectionZip([
      entry('S-001', pdf),
      entry('S-001', pdf),
      entry('S-002', pdf, '../etc/passwd'),
    ])));
    expect(entries.map((e) => e.name)).toEqual([
      'Kinetics_lab-Thursday_B-Mutarotation-S-001-v1-feedback.pdf',
      'Kinetics_lab-Thursday_B-Mutarotation-S-001-v1-feedback-2.pdf',
      'etc_passwd-Thursday_B-Mutarotation-S-002-v1-feedback.pdf',
    ]);
    expect(entries[0].data.equals(pdf)).toBe(true);
  });

  it('streams many entries under backpressure and ends with a readable archive', async () => {
    const pdf = Buffer.alloc(200_000, 7);
    const names = Array.from({ length: 40 }, (_, i) => `S-${String(i + 1).padStart(3, '0')}`);
    const entries = await unzip(await buffer(sectionZip(names.map((name) => entry(name, pdf)))));
    expect(entries).toHaveLength(40);
    expect(entries.every((e) => e.data.length === pdf.length)).toBe(true);
  });

  it('an error from the source destroys the stream with that error', async () => {
    async function* failing(): AsyncGenerator<ZipEntry> {
      yield entry('S-001', Buffer.from('x'));
      throw new Error('render failed');
    }
    await expect(buffer(sectionZip(failing()))).rejects.toThrow('render failed');
  });
});
