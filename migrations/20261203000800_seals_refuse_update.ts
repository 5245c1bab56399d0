import type { Knex } from 'knex';

// A seal cannot be undone or edited (DESIGN §2).
export const sealsUpdateTriggerSql = `
  CREATE TRIGGER seals_refuse_update BEFORE UPDATE ON seals FOR EACH ROW
  SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'A seal cannot be changed.'
`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw(sealsUpdateTriggerSql);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS seals_refuse_update');
}
