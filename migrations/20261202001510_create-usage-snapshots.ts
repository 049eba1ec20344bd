import type { Knex } from 'knex';

/** One usage reading per lab per UTC day (written by the usage job) for the 30-day trend. */
export async function up(knex: Knex): Promise<void> {
  if (await knex.schema.hasTable('usage_snapshots')) return;
  await knex.schema.createTable('usage_snapshots', (t) => {
    t.bigInteger('tenant_id').unsigned().notNullable().references('id').inTable('labs').onDelete('CASCADE');
    t.date('day').notNullable();
    t.bigInteger('readings').unsigned().notNullable();
    t.integer('loggers').unsigned().notNullable();
    t.integer('members').unsigned().notNullable();
    t.primary(['tenant_id', 'day']);
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTableIfExists('usage_snapshots');
}
