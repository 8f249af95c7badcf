import { buildApp } from './app.ts';
import { ConfigError, processRole, readConfig, type Config } from './config.ts';
import { openMigratedStore, StartupError } from './store/open-database.ts';

/**
 * Reads the configuration, opens and migrates the database, serves and works jobs (or one of them, by
 * `flags`) until a signal, then closes.
 */
export async function serve(flags: string[] = []): Promise<void> {
  let config: Config;
  try {
    const read = readConfig();
    config = { ...read, role: processRole(flags, read) };
  } catch (error) {
    if (error instanceof ConfigError) {
      process.stderr.write(`rateproof: ${error.message}\n`);
      process.exit(2);
    }
    throw error;
  }
  let store;
  try {
    ({ store } = await openMigratedStore(config));
  } catch (error) {
    if (!(error instanceof StartupError)) throw error;
    process.stderr.write(`rateproof: ${error.message}\n`);
    process.exit(1);
  }
  const app = await buildApp({ config, store, logger: true });
  const close = async () => {
    await app.close();
    await store.close();
    process.exit(0);
  };
  process.once('SIGINT', close);
  process.once('SIGTERM', close);
  if (config.role === 'jobs') {
    app.log.info('working jobs only (--jobs-only): no requests served');
    return;
  }
  await app.listen({ host: config.host, port: config.port });
  app.log.info(`database: ${store.engine === 'pglite' ? `embedded PostgreSQL in ${config.dataDir}` : 'PostgreSQL server'}; API docs at /docs`);
}
