import type { Knex } from 'knex';

/**
 * Fills `labs.created_by_user_id` for labs made before it existed, from each lab's own
 * `lab.created` audit event (its actor is the person who created it; an operator's creation has
 * no actor and stays null; so does an actor whose account is gone). Safe to rerun: only rows still null are touched.
 */
export async function up(knex: Knex): Promise<void> {
  await knex.raw(
    `UPDATE labs
       JOIN audit_events ON audit_events.tenant_id = labs.id AND audit_events.action = 'lab.created'
       JOIN users ON users.id = audit_events.actor_user_id
        SET labs.created_by_user_id = audit_events.actor_user_id
      WHERE labs.created_by_user_id IS NULL`,
  );
}

/** Nothing to undo: the column goes away with the previous migration's down. */
export async function down(): Promise<void> {}
