import { createDb } from './db/index';
import type { AppConfig } from './config/index';
import { keepSheetResults } from './modules/sheets/sheets.evaluate';
import { uploadsService } from './modules/uploads/uploads.service';
import type { JobStore } from './workers/job-worker';

/**
 * What a worker process reads and writes in MariaDB, wired from the resources (as
 * app-context.ts wires the API's): an upload's bytes by id, checked against the digest its job
 * names, and the results of a background evaluation kept in the results store. The worker loads
 * this on its first job that needs it (api/workers/job-worker.ts).
 */
export function createWorkerStore(dbConfig: AppConfig['db']): JobStore {
  const db = createDb(dbConfig);
  return {
    readUpload: (ref) => uploadsService.readUpload(db, ref),
    keepResults: (digest, sheet, results) => keepSheetResults(db, digest, sheet, results),
    close: () => db.destroy(),
  };
}
