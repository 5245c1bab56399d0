import type { Knex } from 'knex';

// The draft's block sources as one plain text column, kept by MariaDB itself (a stored generated
// column), so a full-text index can cover the words of text and calc blocks without the JSON
// keys. JSON escapes of line breaks and quotes become spaces so the words either side stay whole.
export async function up(knex: Knex): Promise<void> {
  await knex.raw(
    "ALTER TABLE sheets ADD COLUMN draft_text MEDIUMTEXT AS (REPLACE(REPLACE(REPLACE(JSON_EXTRACT(draft, '$.blocks[*].source'), '\\\\n', ' '), '\\\\\"', ' '), '\\\\t', ' ')) STORED",
  );
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('sheets', (t) => {
    t.dropColumn('draft_text');
  });
}
