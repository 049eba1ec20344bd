import { mkdtemp, mkdir, rm, writeFile } from 'node:fs/promises';
import { createRequire } from 'node:module';
import { tmpdir } from 'node:os';
import { dirname, join } from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { cruise, type ICruiseResult, type IConfiguration } from 'dependency-cruiser';

// The import-boundary rules of `.dependency-cruiser.cjs` (run by `npm run lint:boundaries` and
// `npm test`) applied to a small throw-away tree: every planted violation is reported under the
// rule it breaks, and the imports the rules allow are not reported. `npm run lint:boundaries`
// checks the real tree.
const config = createRequire(import.meta.url)('../../.dependency-cruiser.cjs') as IConfiguration;

/** file → its imports (relative specifiers, written as the code base writes them). */
const TREE: Record<string, string[]> = {
  // allowed directions
  'server/http/alerts/alerts.routes.ts': ['../../contract/alerts.ts', '../../services/alerts.service.ts', '../../db/alerts.repo.ts'],
  'server/services/alerts.service.ts': ['../db/alerts.repo.ts', '../contract/alerts.ts', '../errors.ts'],
  'server/services/ingest/readings-from-body.ts': [],
  'server/db/alerts.repo.ts': ['../contract/alerts.ts'],
  'server/contract/alerts.ts': [],
  'server/policies/permissions.ts': ['./roles.ts'],
  'server/policies/roles.ts': [],
  'server/analysis/acf.ts': ['./fft.ts', 'node:assert'],
  'server/analysis/fft.ts': [],
  'server/errors.ts': [],
  'server/db/execute-arrays.ts': [],
  'server/db/readings.repo.ts': ['./execute-arrays.ts'],
  'client/features/alerts/rule-form.ts': ['../../../server/contract/alerts.ts', '../../../server/policies/permissions.ts', '../../lib/api.ts'],
  'client/lib/api.ts': [],
  'client/features/loggers/guide.test.ts': ['../../../server/services/ingest/readings-from-body.ts'],
  'docker-free-scripts/identity-provider/provider.ts': ['../../tenants/demo/people.ts'],
  'tenants/demo/people.ts': [],
  // planted violations
  'server/services/bad-service.ts': ['../http/alerts/alerts.routes.ts'],
  'server/db/bad-service.repo.ts': ['../services/alerts.service.ts'],
  'server/db/bad-http.repo.ts': ['../http/alerts/alerts.routes.ts'],
  'server/analysis/bad.ts': ['../errors.ts'],
  'server/policies/bad.ts': ['../db/alerts.repo.ts'],
  'server/contract/bad.ts': ['../http/alerts/alerts.routes.ts'],
  'server/cli/bad.ts': ['../../docker-free-scripts/identity-provider/provider.ts'],
  'server/bad-client.ts': ['../client/lib/api.ts'],
  'server/bad-missing.ts': ['./no-such-file.ts'],
  'client/features/bad.ts': ['../../server/services/alerts.service.ts'],
  'client/features/bad.test.ts': ['../../server/db/alerts.repo.ts'],
  'client/features/bad-http.ts': ['../../server/http/alerts/alerts.routes.ts'],
  'server/services/bad-sql.ts': ['../db/execute-arrays.ts'],
};

/** Each planted violation and the rule that must report it. */
const PLANTED = [
  'server/services/bad-service.ts services-never-import-http',
  'server/db/bad-service.repo.ts db-never-imports-services-or-http',
  'server/db/bad-http.repo.ts db-never-imports-services-or-http',
  'server/analysis/bad.ts analysis-is-pure',
  'server/policies/bad.ts policies-is-pure',
  'server/contract/bad.ts contract-imports-only-contract-and-policies',
  'server/cli/bad.ts server-never-imports-dev-scripts',
  'server/bad-client.ts server-never-imports-client',
  'server/bad-missing.ts not-to-unresolvable',
  'client/features/bad.ts client-imports-only-shared-server-code',
  'client/features/bad.test.ts client-tests-import-only-shared-server-code',
  'client/features/bad-http.ts client-imports-only-shared-server-code',
  'server/services/bad-sql.ts only-db-speaks-sql',
];

let dir = '';
let result: ICruiseResult;

beforeAll(async () => {
  dir = await mkdtemp(join(tmpdir(), 'lagbook-boundaries-'));
  for (const [file, imports] of Object.entries(TREE)) {
    await mkdir(dirname(join(dir, file)), { recursive: true });
    // Type-only imports count as well: the rules must not be dodged with `import type`.
    const body = imports.map((spec, i) => (i % 2 === 0 ? `import '${spec}';` : `import type * as m${i} from '${spec}';`)).join('\n');
    await writeFile(join(dir, file), `${body}\nexport const here = 1;\n`);
  }
  const { forbidden, options } = config;
  const out = await cruise(['server', 'client', 'tenants', 'docker-free-scripts'], { ...options, baseDir: dir, validate: true, ruleSet: { forbidden } });
  result = out.output as ICruiseResult;
}, 30_000);

afterAll(async () => {
  if (dir) await rm(dir, { recursive: true, force: true });
});

describe('import boundaries (.dependency-cruiser.cjs)', () => {
  it('reports every planted violation under the rule it breaks, and nothing else', () => {
    const reported = result.summary.violations.map((v) => `${v.from} ${v.rule.name}`).sort();
    expect(reported).toEqual([...PLANTED].sort());
  });

  it('cruised the whole planted tree (so a silent skip cannot pass the first check)', () => {
    const sources = result.modules.filter((m) => !m.couldNotResolve && !m.coreModule).map((m) => m.source);
    expect(sources.sort()).toEqual(Object.keys(TREE).sort());
  });
});
