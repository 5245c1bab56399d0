import type { AppConfig } from './config/index';
import type { Db } from './db/index';
import { createAccess } from './http/access';
import type { AppContext } from './http/context';
import type { Logger } from './http/logger';
import { createMailer, type Mailer } from './mail/mailer';
import { membersService } from './modules/members/members.service';
import { outboxService } from './modules/outbox/outbox.service';
import { projectsService } from './modules/projects/projects.service';
import { remarksService } from './modules/remarks/remarks.service';
import { revisionsService } from './modules/revisions/revisions.service';
import { sheetsService } from './modules/sheets/sheets.service';
import { uploadsService } from './modules/uploads/uploads.service';
import type { DetachedEvaluations } from './workers/job-queue';
import {
  inProcessDescriber,
  inProcessRunner,
  type MatrixFileDescriber,
  type SheetRunner,
} from './workers/sheet-runner';

export interface ContextParts {
  db: Db;
  config: AppConfig;
  log: Logger;
  /** Default: SMTP when MW_SMTP_URL is set, else the outbox table. */
  mailer?: Mailer;
  /** Default: the engine in this thread (createApp hands in the worker pool's). */
  runner?: SheetRunner;
  describeMatrixFile?: MatrixFileDescriber;
  /** Evaluations not bound to a request: the queue's (none in-process). */
  evaluations?: DetachedEvaluations;
}

/**
 * The one dependency shape, wired: the access policy over the services' look-ups, the mailer
 * over the outbox, and how evaluations run. createApp builds the app's with the worker pool; the
 * demo seeds build theirs with the engine in-process.
 */
export function createAppContext(parts: ContextParts): AppContext {
  const { db } = parts;
  return {
    db,
    config: parts.config,
    log: parts.log,
    access: createAccess({
      projectExists: (projectId) => projectsService.exists(db, projectId),
      rolesOf: (projectId, userId) => membersService.rolesOf(db, projectId, userId),
      projectOfSheet: (sheetId) => sheetsService.projectIdOf(db, sheetId),
      sheetOfRevision: (revisionId) => revisionsService.sheetIdOf(db, revisionId),
      revisionOfRemark: (remarkId) => remarksService.revisionIdOf(db, remarkId),
    }),
    mailer: parts.mailer ?? createMailer({ store: (entry) => outboxService.store(db, entry) }),
    runner: parts.runner ?? inProcessRunner((ref) => uploadsService.readUpload(db, ref)),
    describeMatrixFile: parts.describeMatrixFile ?? inProcessDescriber,
    ...(parts.evaluations ? { evaluations: parts.evaluations } : {}),
  };
}
