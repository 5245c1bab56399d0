import type { Knex } from 'knex';

// A checker's remark anchored to (revision, block, line-within-block). When Rev n+1 is issued,
// open and answered remarks of Rev n are copied to Rev n+1 (carried_from_* say where from); a
// copy whose line changed or disappeared keeps its old line and is flagged line_changed.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('remarks', (t) => {
    t.increments('id').primary();
    t.integer('revision_id').unsigned().notNullable().references('id').inTable('revisions');
    t.string('block_id', 191).notNullable();
    t.integer('line').unsigned().notNullable();
    t.enum('type', ['error', 'query', 'editorial']).notNullable();
    t.text('text').notNullable();
    t.enum('state', ['open', 'answered', 'closed']).notNullable().defaultTo('open');
    t.integer('carried_from_remark_id').unsigned().nullable().references('id').inTable('remarks');
    t.integer('carried_from_revision_number').unsigned().nullable();
    t.integer('carried_from_line').unsigned().nullable();
    t.boolean('line_changed').notNullable().defaultTo(false);
    t.integer('author_id').unsigned().notNullable().references('id').inTable('users');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.integer('closed_by').unsigned().nullable().references('id').inTable('users');
    t.datetime('closed_at', { precision: 3 }).nullable();
    t.index(['revision_id', 'block_id', 'line'], 'remarks_revision_block_line_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('remarks');
}
