import { isDuplicateKeyError, type DbOrTx } from '../../db/index';

/** Results kept by digest (table evaluation_results): canonical JSON, as evaluated. */
export const sheetsResultsRepository = {
  /** The canonical results JSON stored under `digest`, marking it used; null when none. */
  async find(db: DbOrTx, digest: string): Promise<string | null> {
    const row = (await db('evaluation_results').where({ digest }).first('results_json')) as
      { results_json: string } | undefined;
    if (!row) return null;
    await db('evaluation_results')
      .where({ digest })
      .update({ used_at: db.raw('NOW(3)') });
    return row.results_json;
  },

  /** Keeps `resultsJson` under `digest` (a second store of the same digest is the same text). */
  async save(db: DbOrTx, digest: string, engineVersion: string, resultsJson: string) {
    const now = db.raw('NOW(3)');
    try {
      await db('evaluation_results').insert({
        digest,
        engine_version: engineVersion,
        results_json: resultsJson,
        created_at: now,
        used_at: now,
      });
    } catch (e) {
      if (!isDuplicateKeyError(e)) throw e;
    }
  },
};
