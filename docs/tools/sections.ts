import { endpointTable } from './api-list.ts';
import { errorTable } from './error-table.ts';
import { schemaFieldTable } from './schema-fields.ts';
import { configSchema, contractSchemas, errorEntries, openApiDocument } from './sources.ts';

/**
 * Every generated section by the name its marker gives: `api`, `errors`, `config`, and
 * `schema:<file>` for each JSON Schema of the contract.
 */
export async function generatedSections(): Promise<Record<string, string>> {
  const schemas = Object.entries(contractSchemas()).map(([file, schema]) => [`schema:${file.replace(/\.schema\.json$/, '')}`, schemaFieldTable(schema)]);
  return {
    api: endpointTable(await openApiDocument()),
    errors: errorTable(errorEntries()),
    config: schemaFieldTable(configSchema(), 'variable'),
    ...Object.fromEntries(schemas),
  };
}
