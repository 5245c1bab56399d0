import type { Knex } from 'knex';

// Matrix files uploaded to a sheet (Matrix Market or CSV). A matrix block refers to one by name,
// so names are unique per sheet, and an upload is never changed once stored: a revision re-run at
// seal time must read exactly the bytes it was issued with. The bytes are stored gzip-compressed
// (`encoding`) so that a file at the upload limit fits in MariaDB's default 16 MB packet;
// `size` and `sha256` describe the file as uploaded.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('uploads', (t) => {
    t.increments('id').primary();
    t.integer('sheet_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('sheets')
      .onDelete('CASCADE');
    t.string('name', 191).notNullable();
    t.enum('format', ['matrix-market', 'csv']).notNullable();
    t.integer('size').unsigned().notNullable();
    t.specificType('sha256', 'CHAR(64)').notNullable();
    t.enum('encoding', ['gzip', 'identity']).notNullable().defaultTo('gzip');
    t.specificType('bytes', 'LONGBLOB').notNullable();
    t.integer('rows').unsigned().notNullable();
    t.integer('cols').unsigned().notNullable();
    t.bigInteger('nonzeros').unsigned().notNullable();
    t.boolean('symmetric').notNullable();
    t.json('worst_asymmetry').nullable();
    t.integer('created_by').unsigned().notNullable().references('id').inTable('users');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(['sheet_id', 'name'], { indexName: 'uploads_sheet_name_unique' });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('uploads');
}
