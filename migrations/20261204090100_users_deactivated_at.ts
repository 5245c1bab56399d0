import type { Knex } from 'knex';

// An admin can deactivate a person: the row stays (their revisions, remarks, seals and activity
// keep pointing at it), sign-in is refused while deactivated_at is set, and reactivating clears it.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => {
    t.datetime('deactivated_at', { precision: 3 }).nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('users', (t) => {
    t.dropColumn('deactivated_at');
  });
}
