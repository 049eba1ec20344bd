/**
 * `backup` and `restore` for operators: a logical dump of Lagbook's database with Debian's
 * MariaDB client tools (`mariadb-dump`, `mariadb`), gzip-compressed with node:zlib.
 * The password travels in the child's environment (MYSQL_PWD), never on its command line.
 */
import { spawn } from 'node:child_process';
import { createReadStream, createWriteStream, existsSync, renameSync, rmSync, statSync } from 'node:fs';
import { dirname, basename, join } from 'node:path';
import { open } from 'node:fs/promises';
import { pipeline } from 'node:stream/promises';
import { createGunzip, createGzip } from 'node:zlib';
import type { Config } from '../config.ts';
import type { Db } from '../db/create-db.ts';
import type { CommandResult } from './ops-commands.ts';

/** A backup or restore that was refused or failed; the CLI prints the message and exits 2. */
export class BackupError extends Error {
  override readonly name = 'BackupError';
}

type DbSettings = Config['db'];

const DATABASE_NAME = /^[A-Za-z0-9_]{1,64}$/;

function connectionArgs(db: DbSettings): string[] {
  // --no-defaults first: Debian's /etc/mysql option files must never take over.
  return ['--no-defaults', `--host=${db.host}`, `--port=${db.port}`, `--user=${db.user}`, '--default-character-set=utf8mb4'];
}

/** A MariaDB client tool run with the password in its environment; `done` rejects with its stderr. */
function runTool(tool: string, args: string[], db: DbSettings, pipes: { stdin: boolean; stdout: boolean }) {
  const child = spawn(tool, args, {
    env: { ...process.env, MYSQL_PWD: db.password },
    stdio: [pipes.stdin ? 'pipe' : 'ignore', pipes.stdout ? 'pipe' : 'ignore', 'pipe'],
  });
  let stderr = '';
  child.stderr!.on('data', (chunk: Buffer) => {
    if (stderr.length < 4000) stderr += chunk.toString('utf8');
  });
  const done = new Promise<void>((resolve, reject) => {
    child.once('error', (err: NodeJS.ErrnoException) =>
      reject(
        new BackupError(
          err.code === 'ENOENT' ? `${tool} was not found; install Debian's mariadb-client (it comes with mariadb-server).` : `${tool}: ${err.message}`,
        ),
      ),
    );
    child.once('close', (code) => (code === 0 ? resolve() : reject(new BackupError(`${tool} failed (exit ${code}): ${stderr.trim() || 'no message'}`))));
  });
  return { done, stdout: child.stdout, stdin: child.stdin };
}

/** Waits for a tool and the stream feeding it or fed by it; the tool's own error explains more, so it wins. */
async function settle(tool: Promise<void>, stream: Promise<void>, streamProblem: (err: Error) => string): Promise<void> {
  const [t, s] = await Promise.allSettled([tool, stream]);
  if (t.status === 'rejected') throw t.reason;
  if (s.status === 'rejected') throw new BackupError(streamProblem(s.reason as Error));
}

/**
 * `backup --out <file> [--force]`: a consistent snapshot of the whole database
 * (`--single-transaction`, so ingestion keeps running while it is taken) written to a
 * temporary file beside the target and renamed into place only when complete, so a failed
 * backup never leaves a file that looks whole. An existing file is kept unless `--force`.
 */
export async function backupCommand(db: DbSettings, opts: { out: string; force: boolean }): Promise<CommandResult> {
  if (existsSync(opts.out) && !opts.force) throw new BackupError(`${opts.out} already exists; choose another file or pass --force to replace it.`);
  if (!existsSync(dirname(opts.out))) throw new BackupError(`the folder ${dirname(opts.out)} does not exist.`);
  const partial = join(dirname(opts.out), `.${basename(opts.out)}.partial-${process.pid}`);
  const started = Date.now();
  const args = [...connectionArgs(db), '--single-transaction', '--quick', '--routines', '--triggers', '--hex-blob', '--skip-dump-date', db.database];
  const tool = runTool('mariadb-dump', args, db, { stdin: false, stdout: true });
  try {
    await settle(
      tool.done,
      pipeline(tool.stdout!, createGzip(), createWriteStream(partial, { flags: 'wx' })),
      (err) => `could not write ${opts.out}: ${err.message}`,
    );
    renameSync(partial, opts.out);
  } catch (err) {
    rmSync(partial, { force: true });
    throw err;
  }
  const bytes = statSync(opts.out).size;
  const seconds = (Date.now() - started) / 1000;
  return {
    text: `Backed up database ${db.database} to ${opts.out} (${bytes} bytes compressed, ${seconds.toFixed(1)} s).`,
    json: { database: db.database, file: opts.out, bytes, seconds },
  };
}

async function tableCount(knex: Db, database: string): Promise<number> {
  const [{ n }] = await knex('information_schema.tables').where({ table_schema: database }).count({ n: '*' });
  return Number(n);
}

/**
 * `restore --from <file> [--database <name>] [--force]`: loads a backup into the configured
 * database or into `--database` (created if missing). A target that already holds tables is
 * refused unless `--force`; with it, each table in the backup replaces the one of that name.
 */
export async function restoreCommand(knex: Db, db: DbSettings, opts: { from: string; database?: string; force: boolean }): Promise<CommandResult> {
  const target = opts.database ?? db.database;
  if (!DATABASE_NAME.test(target)) throw new BackupError(`--database: "${target}" is not a database name (letters, digits and _ only, at most 64).`);
  if (!existsSync(opts.from) || !statSync(opts.from).isFile()) throw new BackupError(`${opts.from} does not exist or is not a file.`);
  const header = Buffer.alloc(2);
  const file = await open(opts.from, 'r');
  await file.read(header, 0, 2, 0).finally(() => file.close());
  if (header[0] !== 0x1f || header[1] !== 0x8b) throw new BackupError(`${opts.from} is not a gzip file made by \`ops backup\`.`);

  await knex.raw(`CREATE DATABASE IF NOT EXISTS \`${target}\` CHARACTER SET utf8mb4 COLLATE utf8mb4_unicode_ci`);
  const existing = await tableCount(knex, target);
  if (existing > 0 && !opts.force)
    throw new BackupError(
      `the database ${target} already holds ${existing} tables; restore into an empty one (--database <name>) or pass --force to replace them.`,
    );

  const started = Date.now();
  const tool = runTool('mariadb', [...connectionArgs(db), '--batch', `--database=${target}`], db, { stdin: true, stdout: false });
  await settle(tool.done, pipeline(createReadStream(opts.from), createGunzip(), tool.stdin!), (err) => `could not read ${opts.from}: ${err.message}`);
  const tables = await tableCount(knex, target);
  const seconds = (Date.now() - started) / 1000;
  return {
    text: `Restored ${opts.from} into database ${target} (${tables} tables, ${seconds.toFixed(1)} s).`,
    json: { database: target, file: opts.from, tables, seconds },
  };
}
