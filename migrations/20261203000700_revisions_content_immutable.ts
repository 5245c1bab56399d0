import type { Knex } from 'knex';

// Revision content never changes after it is written (DESIGN §6), whatever the API does and
// whatever SQL is typed by hand. BINARY comparisons: the columns use utf8mb4_unicode_ci, which
// would treat a change of case or of trailing spaces as "equal"; a seal must notice every byte.
const contentColumns = [
  'sheet_id',
  'number',
  'purpose',
  'blocks',
  'settings',
  'canonical_text',
  'results',
  'canonical_text_digest',
  'results_digest',
  'engine_version',
  'issued_by',
  'issued_at',
];

export const revisionsContentTriggerSql = `
  CREATE TRIGGER revisions_content_immutable BEFORE UPDATE ON revisions FOR EACH ROW
  BEGIN
    IF NOT (${contentColumns.map((c) => `BINARY OLD.${c} <=> BINARY NEW.${c}`).join(' AND ')})
      OR NOT (OLD.id <=> NEW.id) THEN
      SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT =
        'A revision''s content (blocks, canonical text, results, digests, engine version, who issued it and when) cannot be changed after it is issued.';
    END IF;
  END
`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw(revisionsContentTriggerSql);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS revisions_content_immutable');
}
