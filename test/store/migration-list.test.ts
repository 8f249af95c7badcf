import { execFile } from 'node:child_process';
import { existsSync } from 'node:fs';
import { mkdtemp, readdir, rm } from 'node:fs/promises';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { promisify } from 'node:util';
import { describe, expect, it } from 'vitest';
import { migrations } from '../../migrations/index.ts';

const root = fileURLToPath(new URL('../../', import.meta.url));

describe('the migration list', () => {
  it('names every file in migrations/, in name order', async () => {
    const files = (await readdir(join(root, 'migrations'))).filter((f) => f.endsWith('.ts') && f !== 'index.ts').map((f) => f.replace(/\.ts$/, ''));
    expect(Object.keys(migrations)).toEqual(files.sort());
    for (const migration of Object.values(migrations)) expect(typeof migration.up).toBe('function');
  });

  it('is what the compiled build applies: npm run migrate on a new embedded database, then again', async () => {
    const cli = join(root, 'dist/server/migrate-cli.js');
    expect(existsSync(cli), 'the compiled build (npm run build; npm test runs it first)').toBe(true);
    const dataDir = await mkdtemp(join(tmpdir(), 'rateproof-migrate-'));
    try {
      const env = { ...process.env, DATABASE_URL: '', RATEPROOF_DATA_DIR: dataDir };
      const first = await promisify(execFile)(process.execPath, [cli], { env });
      expect(first.stdout).toBe(`applied: ${Object.keys(migrations).join(', ')}\n`);
      const second = await promisify(execFile)(process.execPath, [cli], { env });
      expect(second.stdout).toBe('up to date\n');
    } finally {
      await rm(dataDir, { recursive: true, force: true });
    }
  }, 60_000);
});
