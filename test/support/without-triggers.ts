// Runs a piece of a test with the triggers that protect sealed revisions and seals dropped, then
// puts them back whatever happens: how a test plays someone who edits the database by hand.
import type { Knex } from 'knex';
import * as contentTrigger from '../../migrations/20261203000700_revisions_content_immutable';
import * as sealedUpdateTrigger from '../../migrations/20261204130000_sealed_revisions_refuse_update_notes';
import * as sealedDeleteTrigger from '../../migrations/20261203000720_sealed_revisions_refuse_delete';
import * as sealsUpdateTrigger from '../../migrations/20261203000800_seals_refuse_update';
import * as sealsDeleteTrigger from '../../migrations/20261203000810_seals_refuse_delete';

const triggers: { up(db: Knex): Promise<void>; down(db: Knex): Promise<void> }[] = [
  contentTrigger,
  { up: sealedUpdateTrigger.up, down: sealedUpdateTrigger.dropTrigger },
  sealedDeleteTrigger,
  sealsUpdateTrigger,
  sealsDeleteTrigger,
];

export async function withoutTriggers(db: Knex, fn: () => Promise<void>): Promise<void> {
  for (const tr of triggers) await tr.down(db);
  try {
    await fn();
  } finally {
    for (const tr of triggers) await tr.up(db);
  }
}
