import { buildApp } from './app.ts';
import { ConfigError, readConfig } from './config.ts';
import { openStore } from './store/connection.ts';
import { migrateToLatest } from './store/migrate.ts';

/** Reads the configuration, opens and migrates the database, serves until a signal, then closes. */
export async function serve(): Promise<void> {
  let config;
  try {
    config = readConfig();
  } catch (error) {
    if (error instanceof ConfigError) {
      process.stderr.write(`rateproof: ${error.message}\n`);
      process.exit(2);
    }
    throw error;
  }
  const store = openStore(config);
  await migrateToLatest(store.db);
  const app = await buildApp({ config, store, logger: true });
  const close = async () => {
    await app.close();
    await store.db.destroy();
    process.exit(0);
  };
  process.once('SIGINT', close);
  process.once('SIGTERM', close);
  await app.listen({ host: config.host, port: config.port });
  app.log.info(`database: ${store.engine === 'pglite' ? `embedded PostgreSQL in ${config.dataDir}` : 'PostgreSQL server'}; API docs at /docs`);
}
