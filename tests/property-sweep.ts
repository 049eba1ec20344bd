/**
 * Runs every fast-check property file of the unit and client groups under fresh random seeds,
 * one Vitest run per seed, and prints each seed that made a property fail. `npm test` itself
 * always uses one fixed seed (tests/property-seed.ts), so a property that only fails on rare
 * draws never turns a run red by chance; this sweep is where such draws are looked for, before
 * a change lands. A failing seed reproduces with
 * `LAGBOOK_PROPERTY_SEED=<seed> npx vitest run --project unit <file>`.
 *
 * Usage: `npm run test:properties -- [--seeds N]` (default 10).
 */
import { spawnSync } from 'node:child_process';
import { randomInt } from 'node:crypto';
import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join } from 'node:path';

const roots = ['server', 'client', 'tests/unit', 'tests/reference'];

function testFiles(folder: string): string[] {
  const found: string[] = [];
  for (const entry of readdirSync(folder)) {
    const path = join(folder, entry);
    if (entry === 'node_modules') continue;
    if (statSync(path).isDirectory()) found.push(...testFiles(path));
    else if (/\.test\.tsx?$/.test(entry)) found.push(path);
  }
  return found;
}

function seedCount(argv: string[]): number {
  const at = argv.indexOf('--seeds');
  if (at < 0) return 10;
  const count = Number(argv[at + 1]);
  if (!Number.isInteger(count) || count < 1) throw new Error('--seeds takes a positive whole number');
  return count;
}

const files = roots.flatMap(testFiles).filter((file) => readFileSync(file, 'utf8').includes("from 'fast-check'"));
const seeds = Array.from({ length: seedCount(process.argv) }, () => randomInt(1, 2 ** 31 - 1));
const failures: { seed: number; lines: string[] }[] = [];

console.log(`${files.length} property files, ${seeds.length} seeds`);
for (const seed of seeds) {
  const run = spawnSync('npx', ['vitest', 'run', '--project', 'unit', '--project', 'client', ...files], {
    env: { ...process.env, LAGBOOK_PROPERTY_SEED: String(seed) },
    encoding: 'utf8',
    maxBuffer: 64 * 1024 * 1024,
  });
  const output = `${run.stdout}\n${run.stderr}`;
  const failed = output.split('\n').filter((line) => /FAIL|Property failed|Counterexample/.test(line));
  console.log(`seed ${seed}: ${run.status === 0 ? 'passed' : 'FAILED'}`);
  if (run.status !== 0) failures.push({ seed, lines: failed.slice(0, 12) });
}

for (const { seed, lines } of failures) console.log(`\nseed ${seed}\n${lines.join('\n')}`);
console.log(failures.length === 0 ? '\nevery seed passed' : `\n${failures.length} of ${seeds.length} seeds failed`);
process.exitCode = failures.length === 0 ? 0 : 1;
