import type { CsvLayout } from '../../server/input/csv-layout.ts';

/** How the checker reads `reaction-order` submissions from CSV; the parser loads on the first CSV, not with the checker. */
export const reactionOrderCsvLayout: CsvLayout = {
  main: 'readings',
  optional: ['reported'],
  read: async (files) => (await import('./csv.ts')).parseReactionOrderCsv(files.readings, files.reported),
};
