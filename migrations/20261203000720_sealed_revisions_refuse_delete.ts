import type { Knex } from 'knex';

// Nothing sealed is ever deleted, superseded or not.
export const sealedRevisionsDeleteTriggerSql = `
  CREATE TRIGGER sealed_revisions_refuse_delete BEFORE DELETE ON revisions FOR EACH ROW
  BEGIN
    IF OLD.status IN ('sealed', 'superseded') THEN
      SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT = 'A sealed revision cannot be deleted.';
    END IF;
  END
`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw(sealedRevisionsDeleteTriggerSql);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS sealed_revisions_refuse_delete');
}
