import type { Knex } from 'knex';

/** Rows read and converted per transaction: bounded, so the conversion never becomes one huge statement. */
const BATCH = 1000;
const JSON_FIELD = 15;
const MAX_CSV_FIELD = 14;

// A frozen copy of the rule in server/db/quarantine-copies.ts (a migration never changes with the code).
const asText = (v: unknown): string | null => (v === undefined || v === null ? null : typeof v === 'string' ? v : (JSON.stringify(v) ?? null));
function jsonItem(raw: string): Record<string, unknown> | null {
  if (!raw.startsWith('{')) return null;
  try {
    const parsed: unknown = JSON.parse(raw);
    return parsed !== null && typeof parsed === 'object' && !Array.isArray(parsed) ? (parsed as Record<string, unknown>) : null;
  } catch {
    return null;
  }
}
function readSource(raw: string, name: 'ts' | 'value', code: number): string | null | undefined {
  if (code === JSON_FIELD) {
    const item = jsonItem(raw);
    return item ? asText(item[name]) : undefined;
  }
  if (code >= 1 && code <= MAX_CSV_FIELD) return raw.split(',')[code - 1];
  return undefined;
}
function sourceOf(raw: string | null, name: 'ts' | 'value', kept: string | null): number {
  if (raw === null || kept === null) return 0;
  if (readSource(raw, name, JSON_FIELD) === kept) return JSON_FIELD;
  const fields = raw.split(',');
  for (let k = 0; k < Math.min(fields.length, MAX_CSV_FIELD); k++) if (fields[k] === kept) return k + 1;
  return 0;
}

interface Row {
  tenant_id: number;
  id: number;
  raw: string | null;
  ts_raw: string | null;
  value_raw: string | null;
  copied_fields: number;
}

/** Walks quarantined_rows by primary key, BATCH rows a transaction, handing `convert` each batch. */
async function walk(knex: Knex, where: (q: Knex.QueryBuilder) => void, convert: (trx: Knex.Transaction, rows: Row[]) => Promise<void>) {
  let after: [number, number] = [0, 0];
  for (;;) {
    const rows: Row[] = await knex('quarantined_rows')
      .where((q) => q.where('tenant_id', '>', after[0]).orWhere((same) => same.where('tenant_id', after[0]).andWhere('id', '>', after[1])))
      .where(where)
      .orderBy([{ column: 'tenant_id' }, { column: 'id' }])
      .limit(BATCH)
      .select('tenant_id', 'id', 'raw', 'ts_raw', 'value_raw', 'copied_fields');
    if (rows.length === 0) return;
    await knex.transaction((trx) => convert(trx, rows));
    const last = rows[rows.length - 1];
    after = [last.tenant_id, last.id];
  }
}

/**
 * Stores each existing quarantined row's time and value once: where one is a plain copy of a
 * field of the row's original text, its own column is emptied and `copied_fields` says where
 * to read it (checked before: reading it back gives exactly the stored text). In 1,000-row
 * transactions along the primary key; rerunnable (converted rows are skipped).
 */
export async function up(knex: Knex): Promise<void> {
  await walk(
    knex,
    (q) => q.where('copied_fields', 0).whereNotNull('raw'),
    async (trx, rows) => {
      for (const r of rows) {
        const ts = sourceOf(r.raw, 'ts', r.ts_raw);
        const value = sourceOf(r.raw, 'value', r.value_raw);
        if (ts === 0 && value === 0) continue;
        await trx('quarantined_rows')
          .where({ tenant_id: r.tenant_id, id: r.id, copied_fields: 0 })
          .update({ ts_raw: ts === 0 ? r.ts_raw : null, value_raw: value === 0 ? r.value_raw : null, copied_fields: ts | (value << 4) });
      }
    },
  );
}

/** Writes the copied time and value back into their own columns. */
export async function down(knex: Knex): Promise<void> {
  if (!(await knex.schema.hasColumn('quarantined_rows', 'copied_fields'))) return;
  await walk(
    knex,
    (q) => q.where('copied_fields', '>', 0),
    async (trx, rows) => {
      for (const r of rows) {
        const ts = r.copied_fields & 0x0f;
        const value = r.copied_fields >> 4;
        await trx('quarantined_rows')
          .where({ tenant_id: r.tenant_id, id: r.id })
          .update({
            ts_raw: ts === 0 || r.raw === null ? r.ts_raw : (readSource(r.raw, 'ts', ts) ?? null),
            value_raw: value === 0 || r.raw === null ? r.value_raw : (readSource(r.raw, 'value', value) ?? null),
            copied_fields: 0,
          });
      }
    },
  );
}
