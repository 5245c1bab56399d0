import type { Knex } from 'knex';

// One-time password-reset links an admin sends through the mail outbox. Only the SHA-256 of the
// token is kept (the token itself is only in the mail), with its expiry and the moment it was used.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('password_resets', (t) => {
    t.increments('id').primary();
    t.integer('user_id').unsigned().notNullable().references('id').inTable('users');
    t.string('token_hash', 64).notNullable().unique(); // hex SHA-256
    t.integer('created_by').unsigned().notNullable().references('id').inTable('users');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('expires_at', { precision: 3 }).notNullable();
    t.datetime('used_at', { precision: 3 }).nullable();
    t.index(['user_id'], 'password_resets_user_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('password_resets');
}
