import connectPgSimple from 'connect-pg-simple';
import session from 'express-session';
import type { Request, RequestHandler } from 'express';
import type { Pool } from 'pg';
import type { DataSource } from 'typeorm';
import type { Config } from '../config';

export const SESSION_COOKIE = 'etchfile.sid';

/** Sessions live in PostgreSQL (table `user_sessions`, made by a migration), sharing TypeORM's pool. */
export function sessionMiddleware(config: Config, ds: DataSource): RequestHandler {
  const PgStore = connectPgSimple(session);
  const pool = (ds.driver as unknown as { master: Pool }).master;
  return session({
    name: SESSION_COOKIE,
    store: new PgStore({ pool, tableName: 'user_sessions', createTableIfMissing: false, pruneSessionInterval: 15 * 60 }),
    secret: config.sessionSecret,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      // Production sits behind TLS; local mode is plain HTTP on loopback.
      secure: !config.local,
      maxAge: config.sessionMaxAgeMs,
    },
  });
}

/**
 * Stores the session now rather than when the response ends: express-session saves after
 * the headers are sent, so a store that is down would otherwise turn into a 200 carrying
 * state (such as a new CSRF token) that was never kept, instead of a 503.
 */
export function saveSession(req: Request): Promise<void> {
  return new Promise((resolve, reject) => req.session.save((err) => (err ? reject(err) : resolve())));
}
