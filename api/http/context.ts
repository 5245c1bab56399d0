import type { AppConfig } from '../config/index';
import type { Db } from '../db/index';
import type { Mailer } from '../mail/mailer';
import type { DetachedEvaluations } from '../workers/job-queue';
import type { MatrixFileDescriber, SheetRunner } from '../workers/sheet-runner';
import type { Access } from './access';
import type { Logger } from './logger';
import type { User } from '../modules/users/users.repository';

/** What every router factory and service receives from createApp: the one dependency shape. */
export interface AppContext {
  db: Db;
  config: AppConfig;
  log: Logger;
  /** The one access policy (api/http/access.ts). */
  access: Access;
  /** SMTP when MW_SMTP_URL is set, else the outbox table. */
  mailer: Mailer;
  /** Every evaluation: the worker pool's runner in the app. */
  runner: SheetRunner;
  /** Reads an uploaded matrix file: the worker pool's reader in the app. */
  describeMatrixFile: MatrixFileDescriber;
  /** Evaluations not bound to a request (the queue's, in the app; absent in-process). */
  evaluations?: DetachedEvaluations;
}

declare module 'express-session' {
  interface SessionData {
    userId?: number;
    csrfToken?: string;
    signedInAt?: string;
  }
}

declare module 'express-serve-static-core' {
  interface Request {
    /** The signed-in person, set by loadSessionUser; undefined when signed out. */
    user?: User;
  }
}
