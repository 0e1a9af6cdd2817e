/**
 * The layer rule (`npm run depcruise`, part of `npm run lint` and so of .ci/run): imports inside src/
 * point inward only. DEVELOPERS.md, "Habits", says what each rule forbids and why.
 *
 *   src/http  →  src/services  →  src/estimation, src/formats, src/storage (interfaces)  →  src/domain
 *   src/workers runs services off the event loop; src/server.ts wires http, config and storage together.
 *
 * Type-only imports count (`tsPreCompilationDeps`): a type from src/http inside src/services ties the
 * use case to the HTTP shape just as a value import does.
 */

/** npm packages that belong to the HTTP edge (matched on the resolved path). */
const HTTP_PACKAGES = 'node_modules/(fastify|fastify-plugin|fastify-type-provider-zod|@fastify/[^/]+|zod)/';
/** Packages and core modules that do I/O or logging: none of them in the pure physics. */
const IO_PACKAGES = 'node_modules/(fastify|fastify-plugin|fastify-type-provider-zod|@fastify/[^/]+|zod|pino|pg|better-sqlite3|piscina)/';
const FS_MODULES = '^(node:)?fs(/promises)?$';
/**
 * Leaf modules at the top of src/: plain constants that every layer outside the physics may read (the service's
 * limits, its version). They import nothing (rule leaf-modules-import-nothing), so reading them adds no edge.
 */
const LEAF_MODULES = '^src/(limits|version|seeded-random)\\.ts$';

/** @type {import('dependency-cruiser').IConfiguration} */
module.exports = {
  forbidden: [
    {
      name: 'no-circular',
      severity: 'error',
      comment: 'A cycle makes the import order (and what is initialised first) depend on which module is loaded first.',
      from: { path: '^src/' },
      to: { circular: true },
    },
    {
      name: 'domain-is-pure',
      severity: 'error',
      comment: 'src/domain is the physics: it imports nothing of src/ outside src/domain.',
      from: { path: '^src/domain/' },
      to: { path: '^src/', pathNot: '^src/domain/' },
    },
    {
      name: 'domain-no-io',
      severity: 'error',
      comment: 'src/domain does no HTTP, validation, logging, database or file I/O.',
      from: { path: '^src/domain/' },
      to: { path: [IO_PACKAGES, FS_MODULES] },
    },
    {
      name: 'estimation-only-domain',
      severity: 'error',
      comment: 'The estimator builds on the physics only.',
      from: { path: '^src/estimation/' },
      to: { path: '^src/', pathNot: '^src/(estimation|domain)/' },
    },
    {
      name: 'formats-only-domain',
      severity: 'error',
      comment: 'Readers and writers of text formats build on the domain only (time scales, units), and read the limits.',
      from: { path: '^src/formats/' },
      to: { path: '^src/', pathNot: ['^src/(formats|domain)/', LEAF_MODULES] },
    },
    {
      name: 'services-not-outward',
      severity: 'error',
      comment:
        'Use cases in domain shapes: they call domain, estimation, formats and storage, never src/http (API shapes), ' +
        'src/workers (who runs them) or src/server.ts.',
      from: { path: '^src/services/' },
      to: { path: '^src/', pathNot: ['^src/(services|domain|estimation|formats|storage)/', LEAF_MODULES] },
    },
    {
      name: 'services-storage-interfaces-only',
      severity: 'error',
      comment: 'Services see the repository interface; which backend (SQLite, PostgreSQL) is chosen at the edge.',
      from: { path: '^src/services/' },
      to: { path: '^src/storage/(sqlite|postgres)/|^src/storage/factory\\.ts$' },
    },
    {
      name: 'workers-not-http',
      severity: 'error',
      comment: 'Worker tasks run services; what a worker returns is domain data, shaped for the API by src/http.',
      from: { path: '^src/workers/' },
      to: { path: '^src/http/' },
    },
    {
      name: 'storage-not-outward',
      severity: 'error',
      comment: 'Storage knows rows and domain types, not the routes or the use cases that call it.',
      from: { path: '^src/storage/' },
      to: { path: '^src/(http|services|workers)/' },
    },
    {
      name: 'only-edge-imports-http',
      severity: 'error',
      comment: 'src/http is the outermost layer: only src/http itself and src/server.ts import it.',
      from: { path: '^src/', pathNot: '^src/http/|^src/server\\.ts$' },
      to: { path: '^src/http/' },
    },
    {
      name: 'config-at-the-edge',
      comment:
        'src/config.ts (environment, validated with zod) and src/server.ts are read by src/http and src/server.ts only: ' +
        'inner layers get their settings as arguments, and so never reach zod through the configuration.',
      severity: 'error',
      from: { path: '^src/', pathNot: '^src/http/|^src/server\\.ts$' },
      to: { path: '^src/(config|server)\\.ts$' },
    },
    {
      name: 'http-packages-at-the-edge',
      severity: 'error',
      comment:
        'fastify, its plugins and zod belong to src/http; src/config.ts validates the environment with zod and ' +
        'src/server.ts starts fastify, so both are allowed.',
      from: { path: '^src/', pathNot: '^src/http/|^src/config\\.ts$|^src/server\\.ts$' },
      to: { path: HTTP_PACKAGES },
    },
    {
      name: 'leaf-modules-import-nothing',
      severity: 'error',
      comment: 'src/limits.ts and src/version.ts are read from every layer, so they import nothing themselves.',
      from: { path: LEAF_MODULES },
      to: { path: '.' },
    },
    {
      name: 'no-dev-deps-in-src',
      severity: 'error',
      comment: 'The runtime image installs dependencies only (npm ci --omit=dev): src/ must not import a devDependency.',
      from: { path: '^src/' },
      to: { dependencyTypes: ['npm-dev'], dependencyTypesNot: ['type-only'] },
    },
    {
      name: 'not-to-unresolvable',
      severity: 'error',
      comment: 'An import that does not resolve fails at run time.',
      from: { path: '^src/' },
      to: { couldNotResolve: true },
    },
  ],
  options: {
    doNotFollow: { path: 'node_modules' },
    tsPreCompilationDeps: true,
    tsConfig: { fileName: 'tsconfig.build.json' },
    enhancedResolveOptions: {
      exportsFields: ['exports'],
      conditionNames: ['import', 'require', 'node', 'default', 'types'],
      mainFields: ['module', 'main', 'types', 'typings'],
    },
    reporterOptions: { text: { highlightFocused: true } },
  },
};
