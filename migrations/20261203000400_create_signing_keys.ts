import type { Knex } from 'knex';

// One Ed25519 signing key per principal. The private key (PKCS#8 DER) is encrypted with
// AES-256-GCM under a key derived from the principal's password by scrypt, so only the principal
// can unlock it, at the moment of sealing. A password change re-encrypts it (same key pair, new
// salt and nonce), so every earlier seal still verifies against public_key.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('signing_keys', (t) => {
    t.integer('user_id')
      .unsigned()
      .primary()
      .references('id')
      .inTable('users')
      .onDelete('RESTRICT');
    t.string('algorithm', 32).notNullable().defaultTo('ed25519');
    t.text('public_key').notNullable(); // SPKI PEM
    t.text('encrypted_private_key').notNullable(); // base64 ciphertext
    t.string('auth_tag', 64).notNullable(); // base64 GCM tag
    t.string('nonce', 64).notNullable(); // base64, 12 bytes
    t.string('salt', 64).notNullable(); // base64, 16 bytes
    t.text('kdf_params').notNullable(); // JSON { name: 'scrypt', N, r, p, keyLength }
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('signing_keys');
}
