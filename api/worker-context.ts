import { createDb, type Db } from './db/index';
import type { AppConfig } from './config/index';
import { keepSheetResults } from './modules/sheets/sheets.evaluate';
import { uploadsService } from './modules/uploads/uploads.service';
import type { JobStore } from './workers/job-worker';

/**
 * What a worker process reads and writes in MariaDB, wired from the resources (as
 * app-context.ts wires the API's): an upload's bytes by id, checked against the digest its job
 * names, and the results of a background evaluation kept in the results store. The connection
 * opens on the first job that needs it, so a worker whose jobs name no upload never connects.
 */
export function createWorkerStore(dbConfig: AppConfig['db']): JobStore {
  let db: Db | null = null;
  const open = (): Db => (db ??= createDb(dbConfig));
  return {
    readUpload: (ref) => uploadsService.readUpload(open(), ref),
    keepResults: (digest, sheet, results) => keepSheetResults(open(), digest, sheet, results),
    close: async () => {
      await db?.destroy();
    },
  };
}
