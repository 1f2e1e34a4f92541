import { recordAudit, type AuditActor } from '../../audit/record';
import type { Caller } from '../../auth/caller';
import type { Role } from '../../auth/roles';
import type { Db } from '../../db';
import { AppError } from '../../http/errors';

export interface TeamRef {
  id: number;
  slug: string;
  name: string;
}

/** What GET /api/auth/me answers: the caller and the teams they belong to. */
export async function currentUserView(db: Db, caller: Caller) {
  const teams: TeamRef[] = await db('teams').whereIn('id', caller.teamIds).orderBy('name').select('id', 'slug', 'name');
  return { id: caller.id, login: caller.login, name: caller.name, email: caller.email, role: caller.role, teams, via: caller.via };
}

export async function listUsers(db: Db) {
  const users = await db('users').orderBy('login').select('id', 'login', 'name', 'email', 'role', 'last_sign_in_at as lastSignInAt', 'created_at as createdAt');
  const memberships = await db('team_members as m')
    .join('teams as t', 't.id', 'm.team_id')
    .orderBy('t.name')
    .select('m.user_id as userId', 't.id', 't.slug', 't.name', 'm.wants_alert_mail as wantsAlertMail');
  return users.map((u) => ({
    ...u,
    teams: memberships.filter((m) => m.userId === u.id).map(({ userId: _userId, ...team }) => team),
  }));
}

/** An admin changes a user's role; the last admin cannot be demoted, or nobody could manage roles again. */
export async function changeRole(db: Db, actor: AuditActor, userId: number, role: Role) {
  return db.transaction(async (trx) => {
    const user = await trx('users').where({ id: userId }).forUpdate().first('id', 'login', 'role');
    if (!user) throw new AppError(404, 'not_found', `There is no user ${userId}; list the users with GET /api/v1/users.`);
    if (user.role === role) return { id: user.id, login: user.login, role };
    if (user.role === 'admin') {
      const [{ count }] = await trx('users').where({ role: 'admin' }).count<{ count: string }[]>('id as count');
      if (Number(count) <= 1) throw new AppError(409, 'last_admin', `${user.login} is the only admin; make another user admin first.`, 'role');
    }
    await trx('users').where({ id: userId }).update({ role, updated_at: trx.fn.now() });
    await recordAudit(trx, { actor, action: 'user.role_changed', subjectType: 'user', subjectId: userId, before: { role: user.role }, after: { role } });
    return { id: user.id, login: user.login, role };
  });
}
