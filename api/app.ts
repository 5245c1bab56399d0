import { existsSync } from 'node:fs';
import path from 'node:path';
import express from 'express';
import session from 'express-session';
import helmet from 'helmet';
import { createAppContext } from './app-context';
import { loadConfig, type AppConfig } from './config/index';
import { createDb, waitForDb, type Db } from './db/index';
import { createSessionStore } from './db/session-store';
import { loadSessionUser } from './http/auth';
import type { AppContext } from './http/context';
import { passwordCheckLimiter, signInAddressLimiter } from './http/attempt-limits';
import { requireUtf8Body } from './http/body-charset';
import { csrfProtection } from './http/csrf';
import { apiNotFound, errorMiddleware } from './http/error-middleware';
import { createLogger, requestLogger } from './http/logger';
import { refuseInvalidText } from './http/valid-text';
import type { Mailer } from './mail/mailer';
import { createAccountRouter } from './modules/account/account.routes';
import { createActivityRouter } from './modules/activity/activity.routes';
import { createAuthRouter, SESSION_COOKIE } from './modules/auth/auth.routes';
import { createMembersRouter } from './modules/members/members.routes';
import { createOutboxRouter } from './modules/outbox/outbox.routes';
import { createPackagesRouter } from './modules/packages/packages.routes';
import { createProjectsRouter } from './modules/projects/projects.routes';
import { createRemarksRouter } from './modules/remarks/remarks.routes';
import { createRevisionsRouter } from './modules/revisions/revisions.routes';
import { createTemplatesRouter } from './modules/templates/templates.routes';
import { createSealsRouter } from './modules/seals/seals.routes';
import { createSearchRouter } from './modules/search/search.routes';
import { createSheetsRouter } from './modules/sheets/sheets.routes';
import { createUploadsRouter } from './modules/uploads/uploads.routes';
import { createUsersRouter } from './modules/users/users.routes';
import { usersService } from './modules/users/users.service';
import { createVerifyRouter } from './modules/verify/verify.routes';
import { createJobQueue } from './workers/job-queue';

export interface AppOptions extends Partial<AppConfig> {
  /** How often expired sessions are swept, in ms (0 turns the sweep off; tests do). */
  sessionCleanupMs?: number;
  /** Default: SMTP when MW_SMTP_URL is set, else the outbox table. */
  mailer?: Mailer;
}

export interface CreatedApp {
  app: express.Express;
  config: AppConfig;
  /** The app's own pool; tests use it to check the rows written. */
  db: Db;
  /** What every router was built with; tests build a router of their own from it. */
  ctx: AppContext;
  close(): Promise<void>;
}

// The strict policy for the built client (STACK.md: CodeMirror and KaTeX need inline styles).
const strictCsp = {
  useDefaults: false,
  directives: {
    defaultSrc: ["'self'"],
    styleSrc: ["'self'", "'unsafe-inline'"],
    imgSrc: ["'self'", 'data:'],
    fontSrc: ["'self'", 'data:'],
    scriptSrc: ["'self'"],
    connectSrc: ["'self'"],
    objectSrc: ["'none'"],
    frameAncestors: ["'none'"],
    baseUri: ["'self'"],
    formAction: ["'self'"],
  },
};

/**
 * Builds the app: the Knex pool (after MariaDB answers `select 1`), the session store in
 * MariaDB, the API routers and the client (Vite middleware when config.dev, else dist/client).
 * It does not listen; api/server.ts does.
 */
export async function createApp(options: AppOptions = {}): Promise<CreatedApp> {
  const { sessionCleanupMs, mailer, ...overrides } = options;
  const config = loadConfig(overrides);
  const log = createLogger(config.logRequests);
  const db = createDb(config.db);
  const closers: (() => Promise<void> | void)[] = [() => db.destroy()];
  const close = async () => {
    for (const closer of closers.reverse()) await closer();
  };

  try {
    await waitForDb(db, config.db);
    const sessions = await createSessionStore(db, {
      cleanupIntervalMs: sessionCleanupMs ?? 15 * 60 * 1000,
      onError: (e) => log.error('session cleanup failed', e),
    });
    closers.push(() => sessions.close());

    // Every evaluation (editor, issue for check, compare, seal) and every uploaded file's read
    // is a job on the queue, done by a worker process: never in this process.
    const jobs = createJobQueue(config.queue, log);
    closers.push(() => jobs.close());
    const ctx = createAppContext({
      db,
      config,
      log,
      ...(mailer ? { mailer } : {}),
      runner: jobs.runner,
      describeMatrixFile: jobs.describeMatrixFile,
      evaluations: jobs.evaluations,
    });
    const app = express();
    app.disable('x-powered-by');
    // The sign-in limit is keyed on the client address: behind a proxy, say how many hops to trust.
    app.set('trust proxy', config.trustProxyHops > 0 ? config.trustProxyHops : false);

    app.use(requestLogger(log));
    app.use(
      helmet({
        contentSecurityPolicy: config.dev ? false : strictCsp,
        // HSTS only means something behind HTTPS; on plain loopback it is noise.
        strictTransportSecurity: config.secureCookies,
      }),
    );
    app.use(requireUtf8Body);
    app.use(express.json({ limit: config.bodyLimitBytes }));
    app.use(refuseInvalidText);
    // Sessions only for the API: the client's files never touch the sessions table.
    app.use(
      '/api',
      session({
        name: SESSION_COOKIE,
        store: sessions.store,
        secret: config.sessionSecret,
        resave: false,
        saveUninitialized: false,
        rolling: true,
        cookie: {
          httpOnly: true,
          sameSite: 'lax',
          secure: config.secureCookies,
          maxAge: 12 * 60 * 60 * 1000,
          path: '/',
        },
      }),
    );

    const api = express.Router();
    // API answers are never cached: a sheet's status changes without its draft version, so a
    // revalidated copy (ETag → 304) would show a stale status.
    api.use((_req, res, next) => {
      res.set('Cache-Control', 'no-store');
      next();
    });
    api.use(csrfProtection);
    api.use(loadSessionUser((userId) => usersService.findActiveById(db, userId)));
    const window = config.signinWindowMs;
    api.post(
      '/auth/sign-in',
      signInAddressLimiter({ limit: config.signinAddressLimit, windowMs: window }),
    );
    const passwordChecks = passwordCheckLimiter({
      limit: config.passwordCheckLimit,
      windowMs: window,
    });
    api.post(['/auth/password', '/revisions/:revisionId/seal'], passwordChecks);
    api.use('/auth', createAuthRouter(ctx));
    api.use('/auth', createAccountRouter(ctx));
    api.use('/users', createUsersRouter(ctx));
    api.use('/projects/:projectId/members', createMembersRouter(ctx));
    api.use('/projects/:projectId/activity', createActivityRouter(ctx));
    api.use('/projects/:projectId/package', createPackagesRouter(ctx));
    api.use('/projects', createProjectsRouter(ctx));
    api.use(createSheetsRouter(ctx));
    api.use(createUploadsRouter(ctx));
    api.use(createRevisionsRouter(ctx));
    api.use(createRemarksRouter(ctx));
    api.use(createSealsRouter(ctx));
    api.use(createVerifyRouter(ctx));
    api.use(createTemplatesRouter(ctx));
    api.use('/outbox', createOutboxRouter(ctx));
    api.use('/search', createSearchRouter(ctx));
    api.use(apiNotFound);
    app.use('/api', api);

    if (config.dev) {
      const { createServer } = await import('vite');
      const vite = await createServer({ server: { middlewareMode: true }, appType: 'spa' });
      closers.push(() => vite.close());
      app.use(vite.middlewares);
    } else {
      mountBuiltClient(app, config.clientDir);
    }

    app.use(errorMiddleware(log));
    return { app, config, db, ctx, close };
  } catch (e) {
    await close();
    throw e;
  }
}

function mountBuiltClient(app: express.Express, clientDir: string): void {
  const indexHtml = path.join(clientDir, 'index.html');
  app.use(express.static(clientDir, { index: false, maxAge: '1h' }));
  app.get('/{*splat}', (_req, res) => {
    if (existsSync(indexHtml)) {
      res.set('Cache-Control', 'no-cache').sendFile(indexHtml);
    } else {
      res
        .status(503)
        .type('text/plain')
        .send('The client is not built yet: run npm run build, then reload this page.');
    }
  });
}
