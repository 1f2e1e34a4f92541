import type express from 'express';
import request from 'supertest';
import { closeApp, createApp } from '../../../backend/src/app';
import type { Role } from '../../../backend/src/auth/roles';
import type { Db } from '../../../backend/src/db';
import { hashTokenSecret, newTokenSecret, tokenPrefix } from '../../../backend/src/tokens/token-secret';
import { seed as seedTeams } from '../../../seeds/01_teams_and_services';
import { createTestDatabase, testConfig, type TestDatabase } from '../../setup/database';

export interface SketchWorld {
  tdb: TestDatabase;
  db: Db;
  app: express.Express;
  /** A bearer token for a new user of this role, member of these teams (slugs). */
  tokenFor(role: Role, teams?: string[]): Promise<string>;
  close(): Promise<void>;
}

let logins = 0;

/** The real app on a fresh database holding the demo teams and services, and callers signed in by API token. */
export async function startSketchWorld(): Promise<SketchWorld> {
  const tdb = await createTestDatabase();
  await seedTeams(tdb.db);
  const app = createApp({ config: testConfig(tdb.url), db: tdb.db, log: () => {} });
  return {
    tdb,
    db: tdb.db,
    app,
    async tokenFor(role, teams = []) {
      const login = `${role}-${++logins}`;
      const [user] = await tdb.db('users').insert({ login, name: `Test ${login}`, email: `${login}@larkfield.test`, role }).returning('id');
      for (const slug of teams) {
        const team = await tdb.db('teams').where({ slug }).first('id');
        await tdb.db('team_members').insert({ team_id: team.id, user_id: user.id });
      }
      const secret = newTokenSecret();
      await tdb.db('api_tokens').insert({
        user_id: user.id,
        label: `test ${login}`,
        token_hash: hashTokenSecret(secret),
        prefix: tokenPrefix(secret),
        role,
        expires_at: new Date(Date.now() + 86_400_000),
      });
      return secret;
    },
    async close() {
      await closeApp(app);
      await tdb.drop();
    },
  };
}

export const as = (app: express.Express, token: string) => ({
  get: (url: string) => request(app).get(url).set('authorization', `Bearer ${token}`),
  post: (url: string) => request(app).post(url).set('authorization', `Bearer ${token}`),
  patch: (url: string) => request(app).patch(url).set('authorization', `Bearer ${token}`),
  delete: (url: string) => request(app).delete(url).set('authorization', `Bearer ${token}`),
});

/** A valid registration; tests change one field at a time. */
export const validRegistration = () => ({
  service: 'checkout',
  sketch: 'per-card-limiter',
  team: 'payments',
  targetUrl: 'http://127.0.0.1:9500/metrics',
  errorBudget: 50,
  confidence: 0.99,
});
