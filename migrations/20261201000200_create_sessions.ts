import type { Knex } from 'knex';

// Exactly the columns connect-session-knex 5 reads and writes (see its createTable branch for
// MySQL): sid primary key, sess JSON, expired DATETIME indexed. The store runs with
// createTable: false, so this migration is the only place the table is made.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('sessions', (t) => {
    t.string('sid', 191).primary();
    t.json('sess').notNullable();
    t.datetime('expired').notNullable().index();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('sessions');
}
