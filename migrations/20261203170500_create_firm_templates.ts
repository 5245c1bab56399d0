import type { Knex } from 'knex';

// The firm's own sheet templates: a sheet's blocks and settings saved under a name, offered by
// "new sheet" beside the built-in ones. Where it came from is kept twice: as ids (null once the
// source is gone) and as the job number, sheet number and revision number as they were, so the
// record still reads after the project or sheet is renamed. Independent of other tables' changes.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('firm_templates', (t) => {
    t.increments('id').primary();
    t.string('name', 191).notNullable();
    t.string('description', 2000).notNullable().defaultTo('');
    t.json('blocks').notNullable();
    t.json('settings').notNullable();
    t.integer('source_project_id')
      .unsigned()
      .nullable()
      .references('id')
      .inTable('projects')
      .onDelete('SET NULL');
    t.integer('source_sheet_id')
      .unsigned()
      .nullable()
      .references('id')
      .inTable('sheets')
      .onDelete('SET NULL');
    t.integer('source_revision_id')
      .unsigned()
      .nullable()
      .references('id')
      .inTable('revisions')
      .onDelete('SET NULL');
    t.string('source_job_number', 191).notNullable();
    t.string('source_sheet_number', 191).notNullable();
    /** Null when the template was saved from the draft. */
    t.integer('source_revision_number').unsigned().nullable();
    t.integer('created_by').unsigned().notNullable().references('id').inTable('users');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.integer('updated_by').unsigned().notNullable().references('id').inTable('users');
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(['name'], { indexName: 'firm_templates_name_unique' });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('firm_templates');
}
