import type { Knex } from 'knex';

// A revision is a frozen copy of a sheet's draft with its evaluated results (DESIGN §6). The
// content columns (sheet, number, purpose, blocks, settings, canonical text, results, both
// digests, engine version, who issued it and when) are written once; the triggers of
// 20261203000700 refuse any change to them. Only the review columns (status, checked/returned/
// sealed by and at) move, and not at all once the revision is sealed.
// Blocks, settings and results are LONGTEXT holding JSON written by the service, so the exact
// bytes that were frozen are the bytes read back.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('revisions', (t) => {
    t.increments('id').primary();
    t.integer('sheet_id').unsigned().notNullable().references('id').inTable('sheets');
    t.integer('number').unsigned().notNullable();
    t.enum('status', ['in_check', 'returned', 'checked', 'sealed', 'superseded']).notNullable();
    t.string('purpose', 500).notNullable();
    t.text('blocks', 'longtext').notNullable();
    t.text('settings', 'longtext').notNullable();
    t.text('canonical_text', 'longtext').notNullable();
    t.text('results', 'longtext').notNullable();
    t.string('canonical_text_digest', 64).notNullable();
    t.string('results_digest', 64).notNullable();
    t.string('engine_version', 64).notNullable();
    t.integer('issued_by').unsigned().notNullable().references('id').inTable('users');
    t.datetime('issued_at', { precision: 3 }).notNullable();
    t.integer('returned_by').unsigned().nullable().references('id').inTable('users');
    t.datetime('returned_at', { precision: 3 }).nullable();
    t.integer('checked_by').unsigned().nullable().references('id').inTable('users');
    t.datetime('checked_at', { precision: 3 }).nullable();
    t.integer('sealed_by').unsigned().nullable().references('id').inTable('users');
    t.datetime('sealed_at', { precision: 3 }).nullable();
    t.datetime('superseded_at', { precision: 3 }).nullable();
    t.unique(['sheet_id', 'number'], { indexName: 'revisions_sheet_number_unique' });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('revisions');
}
