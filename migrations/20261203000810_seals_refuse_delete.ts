import type { Knex } from 'knex';

export const sealsDeleteTriggerSql = `
  CREATE TRIGGER seals_refuse_delete BEFORE DELETE ON seals FOR EACH ROW
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'A seal cannot be deleted.'
`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw(sealsDeleteTriggerSql);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS seals_refuse_delete');
}
