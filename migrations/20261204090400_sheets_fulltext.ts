import type { Knex } from 'knex';

// Search across sheets: number, title, subject and the draft's block sources in one full-text
// index (MariaDB InnoDB FULLTEXT, matched in boolean mode by the search module).
export async function up(knex: Knex): Promise<void> {
  await knex.raw(
    'ALTER TABLE sheets ADD FULLTEXT INDEX sheets_search_fulltext (number, title, subject, draft_text)',
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('ALTER TABLE sheets DROP INDEX sheets_search_fulltext');
}
