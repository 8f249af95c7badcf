import { delimiterOf } from './csv-table.ts';

/**
 * A student's own CSV file may leave out the student_id column: the layouts need it, so it is added,
 * filled with the signed-in student's id, at the end of the header and of every row. Appended rather
 * than re-written so that every line keeps its number for the layout's messages; rows of bare
 * delimiters (a spreadsheet's trailing rows) are left as they are, for the reader to skip.
 */
export function withStudentColumn(text: string, studentId: string): string {
  const lines = text.split(/(?<=\n)/);
  const headerAt = lines.findIndex((line) => line.trim() !== '');
  if (headerAt < 0) return text;
  const header = lines[headerAt];
  const delimiter = delimiterOf(header);
  const names = header.replace(/^\uFEFF/, '').split(delimiter).map((name) => name.trim().replace(/^"|"$/g, '').toLowerCase());
  if (names.includes('student_id')) return text;
  const bare = new RegExp(`^[\\s${delimiter}]*$`);
  return lines
    .map((line, i) => {
      if (i < headerAt || bare.test(line)) return line;
      const end = /\r?\n$/.exec(line)?.[0] ?? '';
      return `${line.slice(0, line.length - end.length)}${delimiter}${i === headerAt ? 'student_id' : studentId}${end}`;
    })
    .join('');
}
