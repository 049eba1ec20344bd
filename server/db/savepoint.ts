import type { DbOrTrx } from './tenant-scope.ts';

const NAME = /^[a-z][a-z0-9_]{0,63}$/;

function checked(name: string): string {
  if (!NAME.test(name)) throw new Error(`savepoint: name must be lower-case letters, digits and _ (got ${JSON.stringify(name)})`);
  return name;
}

/**
 * Marks a savepoint `name` in the transaction `trx` (a savepoint of the same name set earlier in
 * the transaction is replaced, as MariaDB does), so a step can be undone without losing the rest
 * of the transaction. Outside a transaction it has no effect worth having: pass a transaction.
 */
export async function setSavepoint(trx: DbOrTrx, name: string): Promise<void> {
  await trx.raw(`SAVEPOINT ${checked(name)}`);
}

/** Undoes everything `trx` did since {@link setSavepoint} `name`; the savepoint stays set. */
export async function rollbackToSavepoint(trx: DbOrTrx, name: string): Promise<void> {
  await trx.raw(`ROLLBACK TO SAVEPOINT ${checked(name)}`);
}
