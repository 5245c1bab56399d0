import type { Knex } from 'knex';
import { sealedRevisionsUpdateTriggerSql as before } from './20261203000710_sealed_revisions_refuse_update';

// The sealed-revision trigger again, now also holding fixed what later steps of the review wrote
// on the row: the checker's covering note (check_note), what the checker signed the revision off
// for (checked_purpose) and what the principal sealed it for (sealed_purpose). The only step a
// sealed revision may still take is sealed -> superseded, as before. BINARY comparisons, as for
// the content: a change of case or of a trailing space in a note must be refused too.
const reviewColumns = [
  'returned_by',
  'returned_at',
  'checked_by',
  'checked_at',
  'sealed_by',
  'sealed_at',
  'check_note',
  'checked_purpose',
  'sealed_purpose',
];

export const sealedRevisionsUpdateTriggerSql = `
  CREATE TRIGGER sealed_revisions_refuse_update BEFORE UPDATE ON revisions FOR EACH ROW
  BEGIN
    IF OLD.status IN ('sealed', 'superseded') THEN
      IF NOT (
        OLD.status = 'sealed' AND NEW.status = 'superseded'
        AND OLD.superseded_at IS NULL AND NEW.superseded_at IS NOT NULL
        AND ${reviewColumns.map((c) => `BINARY OLD.${c} <=> BINARY NEW.${c}`).join(' AND ')}
      ) THEN
        SIGNAL SQLSTATE '45000' SET MESSAGE_TEXT =
          'A sealed revision cannot be changed; the only step allowed is sealed to superseded when a later revision is sealed.';
      END IF;
    END IF;
  END
`;

const drop = 'DROP TRIGGER IF EXISTS sealed_revisions_refuse_update';

export async function up(knex: Knex): Promise<void> {
  await knex.raw(drop);
  await knex.raw(sealedRevisionsUpdateTriggerSql);
}

export async function down(knex: Knex): Promise<void> {
  await knex.raw(drop);
  await knex.raw(before);
}

/** Drops the trigger without putting the earlier one back (tests that play a hand edit). */
export async function dropTrigger(knex: Knex): Promise<void> {
  await knex.raw(drop);
}
