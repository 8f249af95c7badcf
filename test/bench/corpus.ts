import { existsSync } from 'node:fs';
import { mkdir, writeFile } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { generateSection } from '../../kinds/first-order-catalysis/demo/generated-section.ts';
import { seededRandom } from '../../server/demo/seeded-random.ts';
import { generateAssignment, studentId } from '../../kinds/first-order-catalysis/demo/submission-generator.ts';

export interface Corpus {
  dir: string;
  assignment: string;
  submissions: string;
  count: number;
}

/**
 * An invented corpus for whole-process benches: one assignment (ln F through the origin, as the
 * baseline script fits) and `count` submissions, a third with one or two common slips. Written once
 * per size to a temporary folder and reused.
 */
export async function corpus(count: number, seed = 8): Promise<Corpus> {
  const dir = join(tmpdir(), `rateproof-bench-corpus-${seed}-${count}`);
  const files = { assignment: join(dir, 'assignment.json'), submissions: join(dir, 'submissions.json') };
  if (!existsSync(files.submissions)) {
    const random = seededRandom(seed);
    const settings = generateAssignment(random, { fitModel: 'origin', reference: true });
    const { submissions } = generateSection(random, settings, Array.from({ length: count }, (_, i) => studentId(i + 1)));
    await mkdir(dir, { recursive: true });
    await writeFile(files.assignment, JSON.stringify(settings));
    await writeFile(`${files.submissions}.part`, JSON.stringify(submissions));
    await import('node:fs/promises').then((fs) => fs.rename(`${files.submissions}.part`, files.submissions));
  }
  return { dir, ...files, count };
}
