import { buffer } from 'node:stream/consumers';
import { describe, expect, it } from 'vitest';
import { sectionZip, type ZipEntry } from '../../reports/section-zip.ts';
import { feedbackSheet } from '../../kinds/documents.ts';
import { feedbackInput, section } from './fixtures.ts';
import { unzip } from '../support/zip-entries.ts';

describe('sectionZip', () => {
  it('holds one feedback PDF per student, named by id, from an async source', async () => {
    const s = section(3, [undefined, 'log-base', 'sign-flipped']);
    async function* sheets(): AsyncGenerator<ZipEntry> {
      for (const student of s.students) {
        yield { name: student.submission.studentId, pdf: await feedbackSheet(feedbackInput(s.settings, student)) };
      }
    }
    const entries = await unzip(await buffer(sectionZip(sheets())));
    expect(entries.map((e) => e.name)).toEqual(['S-001.pdf', 'S-002.pdf', 'S-003.pdf']);
    for (const e of entries) expect(e.data.subarray(0, 5).toString()).toBe('%PDF-');
  });

  it('takes a plain iterable, keeps names safe and unique', async () => {
    const pdf = Buffer.from('%PDF-1.3 not really\n');
    const entries = await unzip(await buffer(sectionZip([
      { name: 'S-001.pdf', pdf },
      { name: 'S-001', pdf },
      { name: '../etc/passwd', pdf },
    ])));
    expect(entries.map((e) => e.name)).toEqual(['S-001.pdf', 'S-001-2.pdf', '_etc_passwd.pdf']);
    expect(entries[0].data.equals(pdf)).toBe(true);
  });

  it('streams many entries under backpressure and ends with a readable archive', async () => {
    const pdf = Buffer.alloc(200_000, 7);
    const names = Array.from({ length: 40 }, (_, i) => `S-${String(i + 1).padStart(3, '0')}`);
    const entries = await unzip(await buffer(sectionZip(names.map((name) => ({ name, pdf })))));
    expect(entries).toHaveLength(40);
    expect(entries.every((e) => e.data.length === pdf.length)).toBe(true);
  });

  it('an error from the source destroys the stream with that error', async () => {
    async function* failing(): AsyncGenerator<ZipEntry> {
      yield { name: 'S-001', pdf: Buffer.from('x') };
      throw new Error('render failed');
    }
    await expect(buffer(sectionZip(failing()))).rejects.toThrow('render failed');
  });
});
