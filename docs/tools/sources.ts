import { z } from 'zod';
import { buildApp } from '../../server/app.ts';
import { ConfigSchema, readConfig } from '../../server/config.ts';
import { apiErrors } from '../../server/errors.ts';
import { openStore } from '../../server/store/connection.ts';
import { jsonSchemas } from '../../kinds/json-schemas.ts';
import type { OpenApiDocument } from './api-list.ts';
import type { ErrorEntry } from './error-table.ts';
import type { JsonSchema } from './schema-fields.ts';

/**
 * What the generated parts of docs/ are made from, each read from the code that defines it. These are
 * the only places that know where; the renderers take plain data.
 */

/**
 * The OpenAPI document of an app built as the tests build it: the default configuration, an embedded
 * store in memory (never queried), checking in the calling thread.
 */
export async function openApiDocument(): Promise<OpenApiDocument> {
  const config = readConfig({ RATEPROOF_DATA_DIR: 'memory://', RATEPROOF_WORKERS: '0', LOG_LEVEL: 'silent' });
  const store = openStore({ dataDir: config.dataDir });
  const app = await buildApp({ config, store });
  try {
    await app.ready();
    return app.swagger() as unknown as OpenApiDocument;
  } finally {
    await app.close();
    await store.close();
  }
}

export function errorEntries(): ErrorEntry[] {
  return Object.entries(apiErrors).map(([code, { status, message }]) => ({ code, status, message }));
}

/**
 * The environment the service reads, as the values it turns them into (numbers, defaults). No variable
 * must be set, so `required` (which the output side gives every variable with a default) is dropped.
 */
export function configSchema(): JsonSchema {
  const schema = z.toJSONSchema(ConfigSchema, { io: 'output', unrepresentable: 'any' }) as JsonSchema;
  return { ...schema, required: [] };
}

/** The public contract's JSON Schemas by file name (`first-order-catalysis.settings.schema.json`, ...). */
export function contractSchemas(): Record<string, JsonSchema> {
  return jsonSchemas() as Record<string, JsonSchema>;
}
