import type { Knex } from 'knex';

/**
 * Whether each alert rule is watching (`alert_rules`): `last_judged_ts`, the newest reading the
 * rule judged; `blind_reason`, `blind_detail` and `blind_since`, why and since when it cannot
 * watch (null while it watches); `blind_episode`, how many times it has stopped watching (the
 * sequence of its not-watching and watching-again mails in the outbox's once-only key); and
 * `blind_mailed_at`, when the not-watching mail of the current episode was queued (null before),
 * so that mail goes out once and its watching-again mail only after it. Written by the evaluator
 * in the rule's own transaction. New columns only, all nullable or with a default, so no backfill:
 * a rule not yet evaluated reads as "never judged, watching".
 */
const COLUMNS: Array<[string, (t: Knex.AlterTableBuilder) => void]> = [
  ['last_judged_ts', (t) => t.bigInteger('last_judged_ts').nullable()],
  ['blind_reason', (t) => t.string('blind_reason', 32).nullable()],
  ['blind_detail', (t) => t.string('blind_detail', 500).nullable()],
  ['blind_since', (t) => t.bigInteger('blind_since').nullable()],
  ['blind_episode', (t) => t.integer('blind_episode').unsigned().notNullable().defaultTo(0)],
  ['blind_mailed_at', (t) => t.bigInteger('blind_mailed_at').nullable()],
];

export async function up(knex: Knex): Promise<void> {
  // one column at a time behind its own guard, so a half-run migration can be run again
  for (const [name, add] of COLUMNS) {
    if (await knex.schema.hasColumn('alert_rules', name)) continue;
    await knex.schema.alterTable('alert_rules', add);
  }
}

export async function down(knex: Knex): Promise<void> {
  for (const [name] of [...COLUMNS].reverse()) {
    if (!(await knex.schema.hasColumn('alert_rules', name))) continue;
    await knex.schema.alterTable('alert_rules', (t) => t.dropColumn(name));
  }
}
