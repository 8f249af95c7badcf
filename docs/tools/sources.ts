import { z } from 'zod';
import { buildApp } from '../../server/app.ts';
import { ConfigSchema } from '../../server/config.ts';
import { apiErrors } from '../../server/errors.ts';
import { openStore } from '../../server/store/connection.ts';
import { jsonSchemas } from '../../schemas/json-schemas.ts';
import type { OpenApiDocument } from './api-list.ts';
import type { ErrorEntry } from './error-table.ts';
import type { JsonSchema } from './schema-fields.ts';

/**
 * What the generated parts of docs/ are made from, each read from the code that defines it. These are
 * the only places that know where; the renderers take plain data.
 */

/** The OpenAPI document of an app built as the tests build it: an embedded store (never opened), no workers. */
export async function openApiDocument(): Promise<OpenApiDocument> {
  const store = openStore({ dataDir: 'memory://' });
  const app = await buildApp({
    config: { dataDir: 'memory://', host: '127.0.0.1', port: 0, bodyLimitBytes: 5 * 1024 * 1024, logLevel: 'silent', workers: 0 },
    store,
  });
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
