import type { Knex } from 'knex';

// Results of evaluations by digest: the SHA-256 of the canonical text, the uploads' digests, the
// engine version and the settings. An editor's evaluation of a sheet already evaluated unchanged
// is answered from here instead of a worker. Only results with no sheet errors are kept (an error
// may depend on a worker's limits), and sealing always re-runs afresh.
export async function up(knex: Knex): Promise<void> {
  await knex.schema.createTable('evaluation_results', (t) => {
    t.specificType('digest', 'CHAR(64) CHARACTER SET ascii').primary();
    t.string('engine_version', 191).notNullable();
    t.specificType('results_json', 'LONGTEXT').notNullable(); // canonical JSON of the results
    t.datetime('created_at', { precision: 3 }).notNullable();
    t.datetime('used_at', { precision: 3 }).notNullable();
    t.index(['used_at'], 'evaluation_results_used');
  });
}

export async function down(knex: Knex): Promise<void> {
  await knex.schema.dropTable('evaluation_results');
}
