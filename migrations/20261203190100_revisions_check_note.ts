import type { Knex } from 'knex';

// The checker's covering note on a return or a sign-off, shown on the revision and sent in the
// mail. Not part of a revision's frozen content (the content trigger lists its columns).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('revisions', (t) => {
    t.text('check_note').nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('revisions', (t) => {
    t.dropColumn('check_note');
  });
}
