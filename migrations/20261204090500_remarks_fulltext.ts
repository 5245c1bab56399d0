import type { Knex } from 'knex';

// Search across remark text (MariaDB InnoDB FULLTEXT).
export async function up(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE remarks ADD FULLTEXT INDEX remarks_text_fulltext (text)');
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE remarks DROP INDEX remarks_text_fulltext');
}
