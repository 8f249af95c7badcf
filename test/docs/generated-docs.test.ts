import { beforeAll, describe, expect, it } from 'vitest';
import { endpointTable, type OpenApiDocument } from '../../docs/tools/api-list.ts';
import { errorTable } from '../../docs/tools/error-table.ts';
import { fillMarkers, sectionsIn, startMarker } from '../../docs/tools/markers.ts';
import { regenerate, type Regenerated } from '../../docs/tools/regenerate.ts';
import { schemaFieldTable, type JsonSchema } from '../../docs/tools/schema-fields.ts';

describe('the generated parts of docs/', () => {
  let files: Regenerated[];
  // Building the app for its OpenAPI document takes a while on a loaded machine.
  beforeAll(async () => {
    files = await regenerate();
  }, 180_000);

  it('are current: regenerated in memory, each file is as committed (else: run npm run docs)', () => {
    const stale = files.filter((f) => f.fresh !== f.current).map((f) => f.file);
    expect(stale, `stale generated docs in ${stale.join(', ')}: run npm run docs`).toEqual([]);
  });

  it('every list the issue asks for is generated somewhere: endpoints, errors, configuration, each JSON Schema', () => {
    const sections = files.flatMap((f) => sectionsIn(f.current));
    // The contract's JSON Schema files, as schemas/json/ holds them (hand-listed).
    for (const name of ['api', 'errors', 'config', 'schema:check-result', 'schema:first-order-catalysis.settings', 'schema:first-order-catalysis.submission', 'schema:temperature-dependence.settings', 'schema:temperature-dependence.submission']) {
      expect(sections).toContain(name);
    }
  });
});

describe('the generators, on hand-written inputs with hand-written expected text', () => {
  it('replaces only what lies between the markers', () => {
    const text = `intro\n${startMarker('errors')}\nold\n<!-- end generated -->\nafter\n`;
    expect(fillMarkers(text, { errors: 'new' }, 'x.md')).toBe(`intro\n${startMarker('errors')}\nnew\n<!-- end generated -->\nafter\n`);
    expect(() => fillMarkers(text, {}, 'x.md')).toThrow(/no generator for the section errors/);
    expect(() => fillMarkers(`${startMarker('api')}\n`, { api: '' }, 'x.md')).toThrow(/has no/);
  });

  it('lists a schema field by field, nested ones by their path', () => {
    const schema: JsonSchema = {
      type: 'object',
      required: ['kind'],
      properties: {
        kind: { type: 'string', const: 'k' },
        runs: { type: 'array', minItems: 1, items: { type: 'object', required: ['t'], properties: { t: { type: 'number', minimum: 0 } } } },
        mode: { type: 'string', enum: ['a', 'b'], default: 'a' },
      },
    };
    expect(schemaFieldTable(schema)).toBe(
      [
        '| field | type | required | default | limits |',
        '| --- | --- | --- | --- | --- |',
        '| `kind` | `"k"` | yes |  |  |',
        '| `runs` | array of object {t} |  |  | 1-... items |',
        '| `runs[].t` | number | yes |  | >= 0 |',
        '| `mode` | `"a"`, `"b"` |  | `"a"` |  |',
      ].join('\n'),
    );
  });

  it('lists endpoints with access, body and responses, and errors by status', () => {
    const document: OpenApiDocument = {
      paths: {
        '/v1/things/{id}': {
          post: {
            summary: 'Make a thing',
            'x-access': 'instructor',
            security: [{ bearer: [] }],
            requestBody: { content: { 'application/json': { schema: { type: 'object', properties: { name: {} } } } } },
            responses: { '201': {}, '404': {}, '400': {} },
          },
        },
      },
    };
    expect(endpointTable(document).split('\n')[2]).toBe('| `POST /v1/things/{id}` | Make a thing | `instructor` | application/json: {name} | 201; errors: 400, 404 |');
    expect(errorTable([{ code: 'b', status: 404, message: 'm' }, { code: 'a', status: 400, message: 'n' }]).split('\n').slice(2)).toEqual(['| `a` | 400 | n |', '| `b` | 404 | m |']);
  });
});
