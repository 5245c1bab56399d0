import type { Knex } from 'knex';

// A principal's signing key is locked under their password. A password set from a reset link
// cannot unlock it (the old password is not known), so the key is retired: its public half is kept
// here with the moment it stopped signing, the row in signing_keys goes, and the next seal makes
// a new key. A seal made before that moment still verifies against the retired key.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('retired_signing_keys', (t) => {
    t.increments('id').primary();
    t.integer('user_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('users')
      .onDelete('RESTRICT');
    t.string('algorithm', 32).notNullable();
    t.text('public_key').notNullable(); // SPKI PEM
    t.datetime('created_at', { precision: 3 }).notNullable();
    t.datetime('retired_at', { precision: 3 }).notNullable();
    t.string('reason', 191).notNullable();
    t.index(['user_id'], 'retired_signing_keys_user');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('retired_signing_keys');
}
