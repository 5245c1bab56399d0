import type { Knex } from 'knex';

// The principal's signed approval of one revision (DESIGN §6). digest is SHA-256 over a
// canonical JSON of what is sealed (see api/modules/seals/seal-digest.ts); signature is the
// Ed25519 signature of that digest; public_key is the key that made it. Principal name, licence
// and jurisdiction are copied as they were at sealing. Rows are never changed or removed (the
// triggers of 20261203000800).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('seals', (t) => {
    t.increments('id').primary();
    t.integer('revision_id')
      .unsigned()
      .notNullable()
      .unique('seals_revision_unique')
      .references('id')
      .inTable('revisions');
    t.string('code', 16).notNullable().unique('seals_code_unique');
    t.integer('principal_id').unsigned().notNullable().references('id').inTable('users');
    t.string('principal_name', 191).notNullable();
    t.string('licence_number', 64).notNullable();
    t.string('jurisdiction', 191).notNullable();
    t.datetime('sealed_at', { precision: 3 }).notNullable();
    t.string('canonical_text_digest', 64).notNullable();
    t.string('results_digest', 64).notNullable();
    t.string('engine_version', 64).notNullable();
    t.string('digest', 64).notNullable();
    t.string('signature', 128).notNullable(); // base64 of the 64-byte Ed25519 signature
    t.text('public_key').notNullable(); // SPKI PEM
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('seals');
}
