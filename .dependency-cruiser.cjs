// Import boundaries of Lagbook, checked by `npm run lint:boundaries` (dependency-cruiser) and by
// `npm test` right after the type-check. Only boundary rules live here: no style rules.
// A rule names the direction that is forbidden; every path is relative to the repository root.
// Type-only imports count too (tsPreCompilationDeps), so `import type` cannot slip through.

/** A pure server function (it imports only server/policies/) that the contract's time parameters
 *  use to parse reading times (contract/channels.ts, contract/ingest.ts). */
const SCHEMA_HELPERS = '^server/services/ingest/parse-reading-time[.]ts$';

/** Pure server functions that client tests (only tests) run, to check that the payloads and
 *  times the client shows in its setup guide are the ones the server's ingest accepts. */
const CLIENT_TEST_ORACLES = '^server/services/ingest/(?:readings-from-body|parse-reading-time)\\.ts$';

/** An error-level rule: no import from a module whose path matches `from` to one matching `to`. */
function forbid(name, comment, from, to) {
  return { name, comment, severity: 'error', from, to };
}

/** A rule: `server/<folder>/` imports nothing of the server outside itself (npm packages are fine). */
function pureFolder(folder, why) {
  return forbid(
    `${folder}-is-pure`,
    `server/${folder}/ is ${why}: it imports nothing else of the server.`,
    { path: `^server/${folder}/` },
    { path: '^server/', pathNot: `^server/${folder}/` },
  );
}

/** A rule: files of the client matching `from` import, outside `client/` and npm packages, only `allowed`. */
function clientImportsOnly(name, comment, from, allowed) {
  const packages = ['npm', 'npm-dev', 'npm-optional', 'npm-peer', 'npm-no-pkg', 'npm-unknown', 'core'];
  return forbid(name, comment, from, { path: '^(?!client/)', pathNot: ['^server/contract/', '^server/policies/', ...allowed], dependencyTypesNot: packages });
}

/** @type {import('dependency-cruiser').IConfiguration} */
module.exports = {
  forbidden: [
    clientImportsOnly(
      'client-imports-only-shared-server-code',
      'The client is built separately: from the server it may import server/contract/ and server/policies/ (through @shared/), nothing else.',
      { path: '^client/', pathNot: '\\.test\\.tsx?$' },
      [],
    ),
    clientImportsOnly(
      'client-tests-import-only-shared-server-code',
      'Client tests may in addition run the two pure ingest parsers as an oracle for the setup guide.',
      { path: '^client/.+\\.test\\.tsx?$' },
      [CLIENT_TEST_ORACLES],
    ),
    forbid(
      'features-share-only-their-api',
      'A client feature imports another feature only through its api/ (query options and server-state hooks, so one resource has one cache entry); shared components live in client/components/.',
      { path: '^client/features/([^/]+)/' },
      { path: '^client/features/', pathNot: ['^client/features/$1/', '^client/features/[^/]+/api/'] },
    ),
    forbid(
      'services-never-import-http',
      'http → services → db: a service never reaches back into the HTTP layer (schemas, routers, presenters).',
      { path: '^server/services/' },
      { path: '^server/http/' },
    ),
    forbid(
      'db-never-imports-services-or-http',
      'http → services → db: repositories know nothing of the layers above them.',
      { path: '^server/db/' },
      { path: '^server/(?:services|http)/' },
    ),
    forbid(
      'only-db-speaks-sql',
      'The database is reached through server/db/ (lab scope and repos): nothing else of the server, the client or the tenants material imports knex or the raw-statement helpers.',
      { path: '^(?:server|client|tenants)/', pathNot: '^server/db/' },
      { path: ['^node_modules/knex/', '^server/db/(?:execute-arrays|load-data-rows)[.]ts$'] },
    ),
    pureFolder('analysis', 'pure numerics'),
    pureFolder('policies', 'shared with the client'),
    forbid(
      'contract-imports-only-contract-and-policies',
      'server/contract/ is bundled into the client: it imports only other contract files, server/policies/ and the reading-time parser.',
      { path: '^server/contract/' },
      { path: '^server/', pathNot: ['^server/contract/', '^server/policies/', SCHEMA_HELPERS] },
    ),
    forbid(
      'server-never-imports-dev-scripts',
      'docker-free-scripts/ is development tooling and stand-ins; the server must run without it.',
      { path: '^server/' },
      { path: '^docker-free-scripts/' },
    ),
    forbid('server-never-imports-client', 'The server does not depend on the browser bundle.', { path: '^server/' }, { path: '^client/' }),
    forbid(
      'not-to-unresolvable',
      'An import that cannot be resolved would hide its target from every rule above.',
      { path: '^(?:server|client|tenants|docker-free-scripts)/' },
      { couldNotResolve: true },
    ),
  ],
  options: {
    doNotFollow: { path: 'node_modules' },
    exclude: { path: '(?:^|/)dist/' },
    tsPreCompilationDeps: true,
    // the client's one alias into the server (`@shared/contract/…`, `@shared/policies/…`)
    tsConfig: { fileName: 'tsconfig.json' },
    combinedDependencies: false,
    // Resolve package.json "exports" (e.g. csv-parse/sync) the way Node does.
    enhancedResolveOptions: {
      exportsFields: ['exports'],
      conditionNames: ['import', 'require', 'node', 'default', 'types'],
      mainFields: ['module', 'main', 'types'],
    },
    reporterOptions: { text: { highlightFocused: true } },
  },
};
