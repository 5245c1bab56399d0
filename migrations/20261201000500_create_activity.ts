import type { Knex } from 'knex';

// Who did what to which object, and when. Rows are never changed or removed (see the triggers in
// the next migration); project_id is null for installation-wide actions (users, sign-in).
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('activity', (t) => {
    t.bigIncrements('id').primary();
    t.datetime('at', { precision: 3 }).notNullable().defaultTo(knex.fn.now(3));
    t.integer('actor_id').unsigned().nullable().references('id').inTable('users');
    t.integer('project_id').unsigned().nullable().references('id').inTable('projects');
    t.string('action', 64).notNullable();
    t.string('object_type', 64).notNullable();
    t.bigInteger('object_id').unsigned().nullable();
    t.json('details').notNullable();
    t.index(['project_id', 'at'], 'activity_project_at_index');
    t.index(['actor_id', 'at'], 'activity_actor_at_index');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('activity');
}
