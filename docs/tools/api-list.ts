import { code, markdownTable } from './markdown-table.ts';

/** The part of an OpenAPI 3 document the endpoint list reads. */
interface Schema {
  $ref?: string;
  title?: string;
  type?: string;
  properties?: Record<string, Schema>;
  items?: Schema;
  anyOf?: Schema[];
  oneOf?: Schema[];
  enum?: unknown[];
}
interface Operation {
  summary?: string;
  security?: unknown[];
  'x-access'?: string;
  requestBody?: { content?: Record<string, { schema?: Schema }> };
  responses?: Record<string, { content?: Record<string, { schema?: Schema }> }>;
}
export interface OpenApiDocument {
  paths: Record<string, Record<string, Operation>>;
  components?: { schemas?: Record<string, Schema> };
}

const METHODS = ['get', 'put', 'post', 'delete', 'patch'];

/** A schema's name where it has one ($ref or title), else its shape in a few words. */
function schemaName(schema: Schema | undefined): string {
  if (!schema) return 'any';
  if (schema.$ref) return schema.$ref.split('/').pop()!;
  if (schema.title) return schema.title;
  const alternatives = schema.anyOf ?? schema.oneOf;
  if (alternatives) return [...new Set(alternatives.map(schemaName))].join(' or ');
  if (schema.type === 'array') return `array of ${schemaName(schema.items)}`;
  if (schema.properties) return `{${Object.keys(schema.properties).join(', ')}}`;
  return schema.type ?? 'any';
}

function requestBody(operation: Operation): string {
  const content = operation.requestBody?.content;
  if (!content) return '';
  return Object.entries(content).map(([type, media]) => `${type}: ${schemaName(media.schema)}`).join('; ');
}

function responses(operation: Operation): string {
  const entries = Object.entries(operation.responses ?? {}).sort(([a], [b]) => a.localeCompare(b));
  const success = entries.filter(([status]) => status.startsWith('2')).map(([status]) => status);
  // The codes of each status are in the table of errors below the list.
  const errors = entries.filter(([status]) => !status.startsWith('2')).map(([status]) => status);
  return [success.join(', '), errors.length ? `errors: ${errors.join(', ')}` : ''].filter(Boolean).join('; ');
}

/** Who may call: the route's declared access, else what its security says. */
function access(operation: Operation): string {
  if (operation['x-access']) return code(operation['x-access']);
  return operation.security?.length ? 'a staff token or session' : 'no token asked';
}

/** The endpoint list: every operation of the document, in its order. */
export function endpointTable(document: OpenApiDocument): string {
  const rows = Object.entries(document.paths).flatMap(([path, operations]) =>
    METHODS.filter((m) => operations[m]).map((method) => {
      const operation = operations[method];
      return [code(`${method.toUpperCase()} ${path}`), operation.summary ?? '', access(operation), requestBody(operation), responses(operation)];
    }),
  );
  return markdownTable(['endpoint', 'what it does', 'access', 'request body', 'responses'], rows);
}
