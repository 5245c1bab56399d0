import type { Knex } from 'knex';

// What a checked revision is for ("For construction"), set by the checker at sign-off. The
// purpose given at issue ("For check") is frozen content and stays as it was.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('revisions', (t) => {
    t.string('checked_purpose', 500).nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('revisions', (t) => {
    t.dropColumn('checked_purpose');
  });
}
