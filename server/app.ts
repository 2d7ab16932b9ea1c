// Builds the Express app: security headers, sessions, sign-in, CSRF, the feature routers and the client.
import fs from "node:fs";
import path from "node:path";
import cookieParser from "cookie-parser";
import express, { Router, type Request, type Response } from "express";
import session from "express-session";
import helmet from "helmet";
import type { Config } from "./config";
import type { Db } from "./db/client";
import { csrfCookie, csrfRefused, createCsrf } from "./auth/csrf";
import { createPassport } from "./auth/passport";
import { endSessionsAfterPasswordChange, type EndSessionsAfterPasswordChange } from "./auth/passwordChangeSessions";
import { authRoutes } from "./auth/routes";
import { SqliteSessionStore } from "./auth/sessionStore";
import type { SignInLimit } from "./auth/signInLimits";
import { errorHandler, notFoundHandler } from "./http/errorHandler";
import { createLogger, type Logger } from "./logging/logger";
import { rememberRoute, requestLog } from "./logging/requestLog";
import { importRoutes } from "./imports/routes";
import { createMailer } from "./mail/mailer";
import { outboxRoutes } from "./mail/routes";
import { healthRoutes } from "./ops/healthRoutes";
import { systemRoutes } from "./ops/systemRoutes";
import { reportRoutes } from "./reports/routes";
import { equipmentRoutes } from "./equipment/routes";
import { alertAfterImport } from "./alerts/importAlerts";
import { alertRoutes } from "./alerts/routes";
import { actionRoutes } from "./actions/routes";
import { insightRoutes } from "./insight/routes";
import { learnerRoutes } from "./learners/routes";
import { trackerRoutes } from "./tracker/routes";
import { projectRoot } from "./projectRoot";
import { policyRoutes } from "./settings/policyRoutes";
import { chartSettingsRoutes } from "./settings/chartRoutes";
import { sessionSecret } from "./settings/store";
import { siteRoutes } from "./sites/routes";
import { userRoutes } from "./users/routes";

export interface AppOptions {
  /** Failed sign-ins allowed per window (see auth/signInLimits). */
  signInLimit?: SignInLimit;
  /** Express's "trust proxy": production trusts one proxy; tests set it to send client addresses. */
  trustProxy?: boolean | number;
  /** Folder of the built client; omitted in API-only tests. */
  clientDir?: string | null;
  /** Where request and event lines go; by default a logger at the configured level on standard output. */
  logger?: Logger;
  /** The local mail service stands in for SMTP_URL (config.smtpUrl then points at it). */
  localMail?: boolean;
  /** The web uploads' folder, used as it is (tests of a restart); by default a new one of this process. */
  uploadDir?: string;
}

const defaultClientDir = path.join(projectRoot, "dist/client");

/** Feature routers mounted under /api. Each one guards its own routes with `allow(...)`. */
function featureRouters(db: Db, config: Config, endSessions: EndSessionsAfterPasswordChange, logger: Logger, options: AppOptions): Router[] {
  const mailer = createMailer(config.smtpUrl);
  return [
    userRoutes(db, mailer, endSessions),
    siteRoutes(db),
    insightRoutes(db),
    actionRoutes(db),
    trackerRoutes(db),
    equipmentRoutes(db),
    learnerRoutes(db),
    policyRoutes(db),
    chartSettingsRoutes(db),
    reportRoutes(db, mailer, logger),
    outboxRoutes(db),
    alertRoutes(db),
    importRoutes(db, { logger, uploadDir: options.uploadDir, afterImport: () => void alertAfterImport(db, mailer, logger) }),
    systemRoutes(db, { backupDir: config.backups.dir, mail: { smtpUrl: config.smtpUrl, localMail: options.localMail ?? false } }),
  ];
}

export function createApp(db: Db, config: Config, options: AppOptions = {}) {
  const production = config.nodeEnv === "production";
  const secret = sessionSecret(db, config.sessionSecret);
  const passport = createPassport(db);
  const csrf = createCsrf(secret, production);
  const logger = options.logger ?? createLogger(config);
  const app = express();

  app.disable("x-powered-by");
  app.use(requestLog(logger));
  const trustProxy = options.trustProxy ?? (production ? 1 : false);
  if (trustProxy !== false) app.set("trust proxy", trustProxy);
  app.use(
    helmet({
      contentSecurityPolicy: {
        directives: { "img-src": ["'self'", "data:", "blob:"], "style-src": ["'self'", "'unsafe-inline'"] },
      },
    }),
  );
  app.use(express.json({ limit: "1mb" }));
  const sessionStore = new SqliteSessionStore(db);
  app.use(
    session({
      name: "qb.sid",
      secret,
      store: sessionStore,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: { httpOnly: true, sameSite: "lax", secure: production, maxAge: 12 * 60 * 60 * 1000 },
    }),
  );
  app.use(cookieParser());
  app.use(passport.session());

  const api = Router();
  api.use(healthRoutes(db));
  api.use((req, res, next) => {
    csrf.doubleCsrfProtection(req, res, (err?: unknown) => next(err ? csrfRefused() : undefined));
  });
  const csrfToken = (req: Request, res: Response) => csrf.generateCsrfToken(req, res, { overwrite: true });
  const endSessions = endSessionsAfterPasswordChange(sessionStore, csrfToken);
  api.use(
    authRoutes({
      db,
      passport,
      csrfToken,
      csrfCookie: csrfCookie(production),
      endSessionsAfterPasswordChange: endSessions,
      signInLimit: options.signInLimit ?? { windowMs: 15 * 60 * 1000, limit: 10 },
    }),
  );
  for (const router of featureRouters(db, config, endSessions, logger, options)) api.use(router);
  api.use(rememberRoute);
  api.use(notFoundHandler);
  app.use("/api", api);

  const clientDir = options.clientDir === undefined ? defaultClientDir : options.clientDir;
  if (clientDir && fs.existsSync(path.join(clientDir, "index.html"))) {
    app.use(express.static(clientDir, { index: false, maxAge: "1h" }));
    // client-side routes: every other GET gets the app shell
    app.get(/^\/(?!api\/).*/, (_req, res) => res.sendFile(path.join(clientDir, "index.html")));
  }

  app.use(errorHandler);
  return app;
}
