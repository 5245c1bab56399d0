import type { Knex } from 'knex';

// The thread under a remark. A carried remark starts its own thread in the new revision; the
// replies of the original stay with the original and are shown through carried_from_remark_id.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('remark_replies', (t) => {
    t.increments('id').primary();
    t.integer('remark_id').unsigned().notNullable().references('id').inTable('remarks');
    t.text('text').notNullable();
    t.integer('author_id').unsigned().notNullable().references('id').inTable('users');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.index(['remark_id', 'created_at'], 'remark_replies_remark_created_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('remark_replies');
}
