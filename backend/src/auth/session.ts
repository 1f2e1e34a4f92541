import type { RequestHandler } from 'express';
import session, { type Store } from 'express-session';
import connectPgSimple from 'connect-pg-simple';
import type pg from 'pg';
import type { Config } from '../config';
import type { Db } from '../db';

declare module 'express-session' {
  interface SessionData {
    userId: number;
    signedInAt: number;
    /** Between GET /api/auth/login and the provider's callback. */
    pendingSignIn: { state: string; nonce: string; codeVerifier: string; returnTo: string };
  }
}

export interface Sessions {
  middleware: RequestHandler;
  store: Store;
  close(): Promise<void>;
}

/**
 * Cookie sessions stored in PostgreSQL (table web_sessions, created by a
 * migration). The store borrows connections from the app's Knex pool, so the
 * server has one pool to size and to close. Idle timeout: the cookie's
 * rolling max age; absolute timeout: checked against signedInAt (identify.ts).
 */
export function createSessions(config: Config, db: Db): Sessions {
  const PgStore = connectPgSimple(session);
  const store = new PgStore({
    pool: knexBackedPool(db),
    tableName: 'web_sessions',
    createTableIfMissing: false,
    pruneSessionInterval: config.NODE_ENV === 'test' ? false : 15 * 60,
    errorLog: (...parts: unknown[]) => console.error('[web] session store:', ...parts),
  });
  const middleware = session({
    name: 'brimwatch.sid',
    secret: config.SESSION_SECRET,
    store,
    resave: false,
    saveUninitialized: false,
    rolling: true,
    cookie: {
      httpOnly: true,
      sameSite: 'lax',
      secure: config.publicUrl.startsWith('https:'),
      maxAge: config.SESSION_IDLE_HOURS * 3600_000,
      path: '/',
    },
  });
  // Automation sends a bearer token and has no use for a cookie session.
  const unlessBearer: RequestHandler = (req, res, next) => (req.get('authorization') === undefined ? middleware(req, res, next) : next());
  return { middleware: unlessBearer, store, close: () => (store as unknown as { close(): Promise<void> }).close() };
}

/** The small part of pg.Pool the store uses, served from Knex's pool. */
function knexBackedPool(db: Db): pg.Pool {
  const query = async (text: string, params?: unknown[]) => {
    const connection = (await db.client.acquireConnection()) as pg.PoolClient;
    try {
      return await connection.query(text, params);
    } finally {
      await db.client.releaseConnection(connection);
    }
  };
  return { query } as unknown as pg.Pool;
}
