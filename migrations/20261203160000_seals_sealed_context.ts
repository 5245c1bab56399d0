import type { Knex } from 'knex';

// A seal vouches for everything /verify shows (DESIGN §6): the project's name and job number and
// the sheet's number and title as they were at sealing, under payload_version 2 of the signed
// digest (api/modules/seals/seal-payload.ts). Seals made before keep payload_version 1 and these
// columns empty: their digest covers what it always covered. Adding columns does not fire the
// row triggers that refuse a change of a seal.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.alterTable('seals', (t) => {
    t.tinyint('payload_version').unsigned().notNullable().defaultTo(1);
    t.string('project_name', 191).nullable();
    t.string('project_job_number', 64).nullable();
    t.string('sheet_number', 191).nullable();
    t.string('sheet_title', 255).nullable();
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.alterTable('seals', (t) => {
    t.dropColumn('sheet_title');
    t.dropColumn('sheet_number');
    t.dropColumn('project_job_number');
    t.dropColumn('project_name');
    t.dropColumn('payload_version');
  });
}
