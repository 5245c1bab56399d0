import type { Knex } from 'knex';

export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('users', (t) => {
    t.increments('id').primary();
    t.string('email', 191).notNullable().unique();
    t.string('name', 191).notNullable();
    t.string('password_hash', 255).notNullable();
    t.boolean('is_admin').notNullable().defaultTo(false);
    t.string('licence_number', 64).nullable();
    t.string('jurisdiction', 191).nullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('users');
}
