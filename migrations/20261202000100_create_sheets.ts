import type { Knex } from 'knex';

// One calculation sheet in a project. The draft (blocks + settings) lives here as JSON with a
// version number for optimistic concurrency: a save names the version it started from and only
// succeeds when that is still the current one. Sheet numbers are unique within a project.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('sheets', (t) => {
    t.increments('id').primary();
    t.integer('project_id').unsigned().notNullable().references('id').inTable('projects');
    t.string('number', 191).notNullable();
    t.string('title', 255).notNullable();
    t.string('subject', 1000).notNullable().defaultTo('');
    t.enum('status', ['draft', 'in_check', 'returned', 'checked', 'sealed'])
      .notNullable()
      .defaultTo('draft');
    t.json('draft').notNullable();
    t.integer('draft_version').unsigned().notNullable().defaultTo(1);
    t.integer('created_by').unsigned().notNullable().references('id').inTable('users');
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.integer('updated_by').unsigned().notNullable().references('id').inTable('users');
    t.datetime('updated_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(['project_id', 'number'], { indexName: 'sheets_project_number_unique' });
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('sheets');
}
