import { readConfig } from './config.ts';
import { openStore } from './store/connection.ts';
import { migrateToLatest } from './store/migrate.ts';

// `npm run migrate`: applies pending migrations to the configured database and exits.
const store = openStore(readConfig());
const applied = await migrateToLatest(store.db);
await store.db.destroy();
process.stdout.write(applied.length ? `applied: ${applied.join(', ')}\n` : 'up to date\n');
