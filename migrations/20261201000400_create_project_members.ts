import type { Knex } from 'knex';

// One row per (project, person, role): a person may hold several roles in a project.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('project_members', (t) => {
    t.increments('id').primary();
    t.integer('project_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('projects')
      .onDelete('CASCADE');
    t.integer('user_id')
      .unsigned()
      .notNullable()
      .references('id')
      .inTable('users')
      .onDelete('CASCADE');
    t.enum('role', ['author', 'checker', 'principal', 'viewer']).notNullable();
    t.datetime('created_at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.unique(['project_id', 'user_id', 'role'], {
      indexName: 'project_members_project_user_role_unique',
    });
    t.index(['user_id'], 'project_members_user_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('project_members');
}
