import type { Knex } from 'knex';

// When its writer last edited a reply (null: never), so the thread can say "edited".
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('remark_replies', (t) => {
    t.datetime('edited_at', { precision: 3 }).nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('remark_replies', (t) => {
    t.dropColumn('edited_at');
  });
}
