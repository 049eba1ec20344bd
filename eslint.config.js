// ESLint for Lagbook (`npm run lint`): the recommended JavaScript and typescript-eslint rules
// without type information (fast on a small machine), the two classic React hook rules for the
// client, and the few house rules of CONVENTIONS/DEVELOPERS that a syntax check can see.
// Import boundaries are not here: dependency-cruiser checks them (`npm run lint:boundaries`).
// Formatting is Prettier's (`npm run format:check`); eslint-config-prettier turns off the
// stylistic rules that would fight it.
import { defineConfig } from 'eslint/config';
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import prettier from 'eslint-config-prettier';

/**
 * Every query on a lab-owned table starts at the tenant scope (server/db/tenant-scope.ts): outside
 * the data layer no code names the tenant column.
 */
const TENANT_COLUMN_OUTSIDE_DATA_LAYER = {
  selector: 'Literal[value=/\\btenant_id\\b/], TemplateElement[value.raw=/\\btenant_id\\b/]',
  message:
    'tenant_id belongs to the data layer: start from the lab scope in server/db/ (inLab, xRepo(scope), :lab in raw SQL) instead of naming the column here.',
};

/**
 * No named locks and no table locks in SQL: under a Galera cluster GET_LOCK/RELEASE_LOCK hold on
 * one node only (MariaDB documents them as unsupported there) and LOCK TABLES is not replicated.
 * Cluster-wide exclusion is a job lease (server/jobs/job-lease.ts); rows are locked by ordinary
 * transactions. Tests and benchmarks (tests/**) may use them to set up a situation.
 */
const NAMED_OR_TABLE_LOCK = {
  selector:
    'Literal[value=/\\b(GET_LOCK|RELEASE_LOCK|RELEASE_ALL_LOCKS|IS_FREE_LOCK|IS_USED_LOCK)\\b|\\b(UN)?LOCK\\s+TABLES?\\b/i], TemplateElement[value.raw=/\\b(GET_LOCK|RELEASE_LOCK|RELEASE_ALL_LOCKS|IS_FREE_LOCK|IS_USED_LOCK)\\b|\\b(UN)?LOCK\\s+TABLES?\\b/i]',
  message:
    'No GET_LOCK/RELEASE_LOCK or LOCK TABLES: they do not hold across a Galera cluster. Use a job lease (server/jobs/job-lease.ts) or row locks in a transaction.',
};

/** Node's globals for the few plain JavaScript files (configs and scripts). */
const nodeGlobals = { process: 'readonly', console: 'readonly', URL: 'readonly', setTimeout: 'readonly', clearTimeout: 'readonly', Buffer: 'readonly' };

export default defineConfig(
  { ignores: ['node_modules/', 'dist/', '.lagbook/', 'test-results/', 'client/dist/'] },
  js.configs.recommended,
  tseslint.configs.recommended,
  {
    files: ['**/*.{js,mjs}'],
    languageOptions: { sourceType: 'module', globals: nodeGlobals },
  },
  {
    files: ['**/*.cjs'],
    languageOptions: { sourceType: 'commonjs', globals: { ...nodeGlobals, module: 'writable', require: 'readonly', __dirname: 'readonly' } },
  },
  {
    rules: {
      // The house marks a binding kept on purpose with a leading underscore: Express's `_next` (an
      // error handler needs four parameters), a rest split that drops a field (`{ cursor: _cursor, ...rest }`).
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_', caughtErrorsIgnorePattern: '^_', destructuredArrayIgnorePattern: '^_' },
      ],
    },
  },
  {
    files: ['client/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'warn',
    },
  },
  {
    // House rules for the server's own code (tests excluded).
    files: ['server/**/*.ts'],
    ignores: ['server/**/*.test.ts'],
    rules: {
      // The server writes its log through the log writer (server/log-writer.ts), which keeps lines
      // structured and leaves secrets out; a stray console call bypasses both.
      'no-console': 'error',
    },
  },
  {
    // Cluster-safe SQL everywhere the app and its migrations run (later blocks repeat the rule
    // where they set no-restricted-syntax again, since a later setting replaces an earlier one).
    files: ['server/**/*.ts', 'migrations/**/*.ts', 'docker-free-scripts/**/*.ts'],
    ignores: ['**/*.test.ts'],
    rules: { 'no-restricted-syntax': ['error', NAMED_OR_TABLE_LOCK] },
  },
  {
    files: ['server/**/*.ts'],
    ignores: ['server/db/**', 'server/**/*.test.ts'],
    rules: { 'no-restricted-syntax': ['error', TENANT_COLUMN_OUTSIDE_DATA_LAYER, NAMED_OR_TABLE_LOCK] },
  },
  prettier,
);
