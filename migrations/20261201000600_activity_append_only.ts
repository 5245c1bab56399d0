import type { Knex } from 'knex';

// The activity log is append-only: the database itself refuses UPDATE and DELETE, so no code
// path (or hand-typed SQL) can rewrite history.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(`
    CREATE TRIGGER activity_refuse_update BEFORE UPDATE ON activity FOR EACH ROW
    SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'The activity log is append-only: rows cannot be changed.'
  `);
  await knex.raw(`
    CREATE TRIGGER activity_refuse_delete BEFORE DELETE ON activity FOR EACH ROW
    SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'The activity log is append-only: rows cannot be removed.'
  `);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS activity_refuse_delete');
  await knex.raw('DROP TRIGGER IF EXISTS activity_refuse_update');
}
