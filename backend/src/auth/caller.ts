import type { Db } from '../db';
import { isRole, type Role } from './roles';

/** Who is calling the API: a signed-in person (cookie session) or an automation with an API token. */
export interface Caller {
  id: number;
  login: string;
  name: string;
  email: string | null;
  role: Role;
  teamIds: number[];
  via: 'session' | 'token';
  tokenId?: number;
  tokenLabel?: string;
}

declare global {
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      /** Set by the identify middleware when the request carries a valid session or API token. */
      user?: Caller;
    }
  }
}

/** Reads a user and their team memberships; undefined when the user row is gone. */
export async function loadCaller(db: Db, userId: number, via: Caller['via']): Promise<Caller | undefined> {
  const row = await db('users').where({ id: userId }).first('id', 'login', 'name', 'email', 'role');
  if (!row || !isRole(row.role)) return undefined;
  const teams = await db('team_members').where({ user_id: userId }).orderBy('team_id').pluck('team_id');
  return { id: Number(row.id), login: row.login, name: row.name, email: row.email, role: row.role, teamIds: teams.map(Number), via };
}
