import type { Knex } from 'knex';

// What a sealed revision is for ("For construction"), stated by the principal at the seal when it
// differs from what the checker signed it off for. The purpose given at issue stays as it was.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('revisions', (t) => {
    t.string('sealed_purpose', 500).nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('revisions', (t) => {
    t.dropColumn('sealed_purpose');
  });
}
