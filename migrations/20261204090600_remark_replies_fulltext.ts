import type { Knex } from 'knex';

// Search across the replies in remark threads (MariaDB InnoDB FULLTEXT).
export async function up(knex: Knex): Promise<void> {
  await knex.raw(
    'ALTER TABLE remark_replies ADD FULLTEXT INDEX remark_replies_text_fulltext (text)',
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE remark_replies DROP INDEX remark_replies_text_fulltext');
}
