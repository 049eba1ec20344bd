import type { Knex } from 'knex';

/**
 * An alert's stage and projection (issue #22, early warning): `stage` is 'crossed' (a limit or
 * pattern was passed — every alert so far) or 'expected' (a bounds rule's early warning: the
 * projection gives a high chance of passing the limit soon); `projection` holds, as JSON text,
 * the model, chance and band an expected-stage alert was based on. An expected-stage alert may
 * be open beside its rule's crossed-stage alert, so it keeps its rule's id in its own
 * `open_warning_rule_id` while open, with its own unique key (one open warning per rule, as
 * `alerts_one_open_per_rule` allows one open crossed-stage alert). Existing rows are all
 * crossed-stage: the default says so, no backfill is needed.
 */
export async function up(knex: Knex): Promise<void> {
  if (!(await knex.schema.hasColumn('alerts', 'stage'))) {
    await knex.schema.alterTable('alerts', (t) => {
      t.string('stage', 16).notNullable().defaultTo('crossed');
    });
  }
  if (!(await knex.schema.hasColumn('alerts', 'projection'))) {
    await knex.schema.alterTable('alerts', (t) => {
      t.text('projection').nullable();
    });
  }
  if (!(await knex.schema.hasColumn('alerts', 'open_warning_rule_id'))) {
    await knex.schema.alterTable('alerts', (t) => {
      t.bigInteger('open_warning_rule_id').unsigned().nullable();
      t.unique(['tenant_id', 'open_warning_rule_id'], { indexName: 'alerts_one_open_warning_per_rule' });
    });
  }
}

export async function down(knex: Knex): Promise<void> {
  if (await knex.schema.hasColumn('alerts', 'open_warning_rule_id')) {
    await knex.schema.alterTable('alerts', (t) => {
      t.dropUnique(['tenant_id', 'open_warning_rule_id'], 'alerts_one_open_warning_per_rule');
      t.dropColumn('open_warning_rule_id');
    });
  }
  for (const column of ['projection', 'stage']) {
    if (await knex.schema.hasColumn('alerts', column)) {
      await knex.schema.alterTable('alerts', (t) => {
        t.dropColumn(column);
      });
    }
  }
}
