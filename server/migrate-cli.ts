import { readConfig } from './config.ts';
import { openMigratedStore, StartupError } from './store/open-database.ts';

// `npm run migrate`: applies pending migrations to the configured database and exits.
try {
  const { store, applied } = await openMigratedStore(readConfig());
  await store.close();
  process.stdout.write(applied.length ? `applied: ${applied.join(', ')}\n` : 'up to date\n');
} catch (error) {
  if (!(error instanceof StartupError)) throw error;
  process.stderr.write(`rateproof: ${error.message}\n`);
  process.exitCode = 1;
}
