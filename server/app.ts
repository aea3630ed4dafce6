import 'reflect-metadata';
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import express, { type Express } from 'express';
import session from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import { pinoHttp } from 'pino-http';
import pg from 'pg';
import { env } from './lib/env';
import { logger } from './lib/logger';
import { passport } from './lib/auth';
import { csrfProtection } from './lib/csrf';
import { errorHandler, notFoundApi } from './lib/http-errors';
import { authRouter } from './routes/auth-routes';
import { studioRouter } from './routes/studio-routes';
import { kitRouter } from './routes/kit-routes';
import { planRouter } from './routes/plan-routes';
import { healthRouter } from './routes/health-routes';
import { sessionRouter } from './routes/session-routes';
import { stackRouter } from './routes/stack-routes';
import { handoffRouter } from './routes/handoff-routes';
import { shareRouter } from './routes/share-routes';
import { checkRouter } from './routes/check-routes';
import { registeredRoutes } from './lib/route';

export interface AppOptions {
  /** Folder of the built client to serve (dist/client); omitted in API tests. */
  clientDir?: string;
}

let sessionPool: pg.Pool | undefined;

export function createApp(options: AppOptions = {}): Express {
  const e = env();
  registeredRoutes.length = 0;
  const app = express();
  app.disable('x-powered-by');
  if (e.TRUST_PROXY === 'on') app.set('trust proxy', 1);

  app.use(
    pinoHttp({
      logger,
      genReqId: (req, res) => {
        const id = crypto.randomUUID();
        res.setHeader('X-Request-Id', id);
        return id;
      },
      autoLogging: { ignore: (req) => !req.url?.startsWith('/api') },
    }),
  );
  app.use((_req, res, next) => {
    res.setHeader('X-Content-Type-Options', 'nosniff');
    res.setHeader('Referrer-Policy', 'same-origin');
    res.setHeader('X-Frame-Options', 'DENY');
    next();
  });
  app.use('/api', express.json({ limit: '1mb' }));

  sessionPool ??= new pg.Pool({ connectionString: e.DATABASE_URL, max: 5 });
  const PgStore = connectPgSimple(session);
  app.use(
    session({
      name: 'lamella.sid',
      store: new PgStore({ pool: sessionPool, tableName: 'session', createTableIfMissing: false }),
      secret: e.SESSION_SECRET,
      resave: false,
      saveUninitialized: false,
      rolling: true,
      cookie: { httpOnly: true, sameSite: 'lax', secure: 'auto', maxAge: 14 * 24 * 3600 * 1000 },
    }),
  );
  app.use(passport.session());
  app.use('/api', csrfProtection);

  app.use(healthRouter());
  app.use(authRouter());
  app.use(studioRouter());
  app.use(sessionRouter());
  app.use(stackRouter());
  app.use(kitRouter());
  app.use(planRouter());
  app.use(handoffRouter());
  app.use(shareRouter());
  app.use(checkRouter());
  app.use('/api', notFoundApi);

  if (options.clientDir && fs.existsSync(options.clientDir)) {
    const dir = path.resolve(options.clientDir);
    app.use(express.static(dir, { index: false, maxAge: '1h' }));
    app.get(/^(?!\/api\/).*/, (_req, res) => res.sendFile(path.join(dir, 'index.html')));
  }
  app.use(errorHandler);
  return app;
}

export async function closeApp() {
  await sessionPool?.end();
  sessionPool = undefined;
}
