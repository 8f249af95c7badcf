/**
 * The import map's rules: no circles, and each layer imports only the layers below it. Checked by
 * test/house/import-layers.test.ts (so in `npm test`) and by `npm run deps`.
 *
 * At the ground: engine, schemas, input, config and errors. Above them signals, then checks, reports
 * (all three generic: they name no kind), each kind's folder under kinds/<kind>/ on those, the kinds
 * registry (kinds/*.ts) above every kind, batches and the pool, each on the one before; the store beside those, the
 * job queue on the store; grading on all of them; routes and HTTP on grading; the app, the command and the demo on top. web/ is apart.
 */

// Every path of ours; a rule below forbids those of them a layer may not import.
const OURS = '^(server|kinds|reports|schemas|migrations|web|bin)/';
const LOW_ROOT_FILES = '^server/(config|errors)[.]ts$';

/** A layer that may import only `allowed` of ours (its own folder among them). */
function layer(name, from, allowed, comment) {
  return { name, comment, severity: 'error', from: { path: from }, to: { path: OURS, pathNot: allowed } };
}

module.exports = {
  forbidden: [
    {
      name: 'no-circular',
      comment: 'Files that import each other, however long the loop, cannot be read or changed one at a time.',
      severity: 'error',
      from: {},
      to: { circular: true },
    },
    layer('engine-imports-nothing-of-ours', '^server/engine/', '^server/engine/', 'The engine is pure numerics: regressions, fits, units.'),
    layer('schemas-import-only-schemas', '^schemas/', '^schemas/', 'The public contract stands on its own.'),
    layer('config-and-errors-at-the-ground', LOW_ROOT_FILES, ['^schemas/', LOW_ROOT_FILES], 'Everything may use them, so they use nothing above.'),
    layer('input-reads-files-only', '^server/input/', '^(server/(input|engine)|schemas)/', 'File readers know no checker.'),
    layer('signals-below-checks', '^server/signals/', '^(server/(signals|engine)|schemas)/', "A kind's checker names its section signals; signals know no checker."),
    layer(
      'checks-know-no-documents',
      '^server/checks/',
      '^(server/(checks|engine|signals|input)|schemas)/',
      'The checker gives results; the documents and the registry of kinds stand above it.',
    ),
    layer(
      'reports-draw-results-only',
      '^reports/',
      [
        '^(reports|schemas|server/engine)/',
        // The result types of a section's signals, and the one rubric arithmetic the checker and the sheet share.
        '^server/signals/section-report[.]ts$',
        '^server/checks/rubric-books[.]ts$',
      ],
      'Result in, bytes out: a kind is handed to the documents, never looked up by them.',
    ),
    layer(
      'the-registry-composes-kinds',
      '^kinds/[^/]+[.]ts$',
      '^(kinds|reports|schemas|server/(checks|signals|engine|input))/',
      'The registry and its users in kinds/ stand above every kind and the generic layers.',
    ),
    {
      name: 'a-kind-on-the-generic-layers',
      comment: "A kind's folder holds all of that kind and stands on the generic layers; it never uses another kind or the registry.",
      severity: 'error',
      from: { path: '^kinds/([^/]+)/', pathNot: '^kinds/[^/]+/demo/' },
      to: { path: OURS, pathNot: ['^kinds/$1/', '^kinds/kind-entry[.]ts$', '^(reports|schemas|server/(checks|signals|engine|input))/'] },
    },
    {
      name: 'a-kind-demo-on-the-demo',
      comment: "A kind's demo may also use the demo's seeded random numbers and synthetic runs, and gives the registry its part of the demo (kinds/kind-entry.ts).",
      severity: 'error',
      from: { path: '^kinds/([^/]+)/demo/' },
      to: { path: OURS, pathNot: ['^kinds/$1/', '^kinds/kind-entry[.]ts$', '^(reports|schemas|server/(checks|signals|engine|input|demo))/'] },
    },
    {
      name: 'a-kind-checker-knows-no-documents',
      comment: "As the generic checker, a kind's schemas, CSV reader and checks give results and never draw.",
      severity: 'error',
      from: { path: '^kinds/[^/]+/(checks/|schemas[.]ts$|csv[.]ts$)' },
      to: { path: ['^reports/', '^kinds/[^/]+/(report|demo)/'] },
    },
    {
      name: 'a-kind-schema-is-contract',
      comment: "A kind's schemas are part of the public contract: they stand on schemas/ alone.",
      severity: 'error',
      from: { path: '^kinds/[^/]+/schemas[.]ts$' },
      to: { path: OURS, pathNot: '^(schemas/|kinds/[^/]+/schemas[.]ts$)' },
    },
    layer('batches-below-pool', '^server/batches/', '^(server/(batches|checks|signals|engine|input)|kinds|reports|schemas)/', 'The work a worker does, below the pool that runs it.'),
    layer('store-below-its-users', '^server/store/', ['^(server/store|schemas|migrations)/', LOW_ROOT_FILES], 'SQL knows nothing of grading or HTTP.'),
    layer('lti-on-the-store', '^server/lti/', ['^(server/(lti|store)|schemas|migrations)/', LOW_ROOT_FILES], "A learning platform's messages and services, kept in the store; grading and the routes use them."),
    layer('jobs-on-the-store', '^server/jobs/', ['^(server/(jobs|store)|schemas|migrations)/', LOW_ROOT_FILES], 'The job queue keeps jobs in the database; it knows no job type.'),
    layer('pool-runs-batches-and-kinds', '^server/pool/', '^(server/(pool|batches)|kinds)/', 'The pool names its tasks; the command and grading use the pool.'),
    layer(
      'grading-below-routes',
      '^server/grading/',
      ['^(server/(grading|jobs|lti|pool|batches|store|checks|signals|engine|input)|kinds|reports|schemas)/', LOW_ROOT_FILES],
      'What a request or a job does with the checker and the store, without HTTP.',
    ),
    {
      name: 'routes-below-the-app',
      comment: 'Routes and HTTP plumbing may use any layer below them, never the app, the command or the demo.',
      severity: 'error',
      from: { path: '^server/(routes|http)/' },
      to: { path: ['^server/(cli|demo)/', '^server/(app|main|cli|migrate-cli)[.]ts$', '^web/'] },
    },
    {
      name: 'migrations-stand-alone',
      comment: 'A migration is frozen once written: it may not change because server code did.',
      severity: 'error',
      from: { path: '^migrations/' },
      to: { path: OURS, pathNot: '^migrations/' },
    },
    {
      name: 'web-apart',
      comment: "The browser's modules are served as they are: of ours they take only the API's types, from schemas/.",
      severity: 'error',
      from: { path: '^web/' },
      to: { path: OURS, pathNot: '^(web|schemas)/' },
    },
    {
      name: 'nothing-imports-web',
      severity: 'error',
      from: { pathNot: '^web/' },
      to: { path: '^web/' },
    },
  ],
  options: {
    tsPreCompilationDeps: true,
    // The sources of the service, the documents and the page; tests may reach any layer.
    includeOnly: OURS,
    exclude: { path: '^(dist|node_modules)/' },
    // csv-parse/sync and the like are found through their package's exports map.
    enhancedResolveOptions: { exportsFields: ['exports'], conditionNames: ['import', 'require', 'node', 'default'] },
  },
};
