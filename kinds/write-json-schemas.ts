import { mkdirSync, writeFileSync } from 'node:fs';
import { jsonSchemas } from './json-schemas.ts';

// `npm run schemas`: regenerates schemas/json/ from the zod schemas, the one source of truth.
const dir = new URL('../schemas/json/', import.meta.url);
mkdirSync(dir, { recursive: true });
for (const [name, schema] of Object.entries(jsonSchemas())) {
  writeFileSync(new URL(name, dir), `${JSON.stringify(schema, null, 2)}\n`);
}
