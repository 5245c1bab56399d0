import type { Knex } from 'knex';

// A sealed or superseded revision is fixed for good. The one change allowed is the status step
// sealed -> superseded, made when a later revision of the same sheet is sealed: the older seal
// stays valid as a record of what was approved then, and the sheet's history must say which
// revision is current (DESIGN §6: "a newer sealed revision supersedes the older one; nothing is
// deleted"). It is constrained to exactly that: the old status must be 'sealed', the new one
// 'superseded', superseded_at goes from NULL to a time, and every other review column (returned,
// checked and sealed by and at) stays byte for byte the same. Content columns are guarded by
// revisions_content_immutable in any state. A superseded revision cannot change at all.
const reviewColumns = [
  'returned_by',
  'returned_at',
  'checked_by',
  'checked_at',
  'sealed_by',
  'sealed_at',
];

export const sealedRevisionsUpdateTriggerSql = `
  CREATE TRIGGER sealed_revisions_refuse_update BEFORE UPDATE ON revisions FOR EACH ROW
  BEGIN
    IF OLD.status IN ('sealed', 'superseded') THEN
      IF NOT (
        OLD.status = 'sealed' AND NEW.status = 'superseded'
        AND OLD.superseded_at IS NULL AND NEW.superseded_at IS NOT NULL
        AND ${reviewColumns.map((c) => `OLD.${c} <=> NEW.${c}`).join(' AND ')}
      ) THEN
        SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT =
          'A sealed revision cannot be changed; the only step allowed is sealed to superseded when a later revision is sealed.';
      END IF;
    END IF;
  END
`;

export async function up(knex: Knex): Promise<void> {
  await knex.raw(sealedRevisionsUpdateTriggerSql);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw('DROP TRIGGER IF EXISTS sealed_revisions_refuse_update');
}
