import { writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { regenerate, repoRoot } from './tools/regenerate.ts';

// `npm run docs`: rewrites the generated parts of README.md and docs/ from the code that defines them.
for (const { file, current, fresh } of await regenerate()) {
  if (fresh === current) continue;
  writeFileSync(join(repoRoot, file), fresh);
  process.stdout.write(`rewrote ${file}\n`);
}
