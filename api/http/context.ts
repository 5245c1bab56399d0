import type { AppConfig } from '../config/index';
import type { Db } from '../db/index';
import type { Logger } from './logger';
import type { User } from '../modules/users/users.repository';

/** What every router factory receives from createApp. */
export interface AppContext {
  db: Db;
  config: AppConfig;
  log: Logger;
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
