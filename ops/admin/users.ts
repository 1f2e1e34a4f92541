import { recordAudit, type AuditActor } from '../../backend/src/audit/record';
import { changeRole } from '../../backend/src/services/access/users';
import type { Role } from '../../backend/src/auth/roles';
import type { Db } from '../../backend/src/db';
import { demoAccountByLogin } from '../oidc-provider/demo-accounts';

export class UsageError extends Error {}

/**
 * The user with this login; a demo account's row is made on the spot (as its
 * first sign-in would), so an operator can mint a token before anyone signed in.
 */
export async function userForLogin(db: Db, actor: AuditActor, login: string): Promise<{ id: number; login: string; role: Role }> {
  const found = await db('users').where({ login }).first('id', 'login', 'role');
  if (found) return found;
  const demo = demoAccountByLogin(login);
  if (!demo) throw new UsageError(`There is no user "${login}". They must sign in to Brimwatch once; only the demo logins (admin, sre, owner, responder, viewer) are made here.`);
  return db.transaction(async (trx) => {
    const [user] = await trx('users')
      .insert({ login: demo.login, subject: demo.subject, name: demo.name, email: demo.email, role: demo.role }, ['id', 'login', 'role'])
      .onConflict('login')
      .ignore();
    const row = user ?? (await trx('users').where({ login }).first('id', 'login', 'role'));
    if (user) await recordAudit(trx, { actor, action: 'user.created', subjectType: 'user', subjectId: user.id, after: { login: demo.login, role: demo.role } });
    return row;
  });
}

/** The operator's role change, through the same rule as the admin page (the last admin stays). */
export async function setRole(db: Db, actorLogin: string, login: string, role: Role) {
  const user = await db('users').where({ login }).first('id');
  if (!user) throw new UsageError(`There is no user "${login}"; they must sign in to Brimwatch once first.`);
  return changeRole(db, { login: actorLogin }, Number(user.id), role);
}
