import { recordAudit } from '../../audit/record';
import type { Caller } from '../../auth/caller';
import { assertTeamAccess } from '../../auth/team-access';
import type { Db } from '../../db';
import { AppError } from '../../http/errors';

export interface TeamAddresses {
  alertEmail?: string | null;
  escalationEmail?: string | null;
}

const teamColumns = ['id', 'slug', 'name', 'alert_email as alertEmail', 'escalation_email as escalationEmail'];

export async function listTeams(db: Db) {
  const teams = await db('teams').orderBy('name').select(teamColumns);
  const members = await db('team_members as m')
    .join('users as u', 'u.id', 'm.user_id')
    .orderBy('u.login')
    .select('m.team_id as teamId', 'u.id', 'u.login', 'u.name', 'u.email', 'u.role', 'm.wants_alert_mail as wantsAlertMail');
  return teams.map((t) => ({ ...t, members: members.filter((m) => m.teamId === t.id).map(({ teamId: _teamId, ...m }) => m) }));
}

async function teamForUpdate(trx: Db, teamId: number) {
  const team = await trx('teams').where({ id: teamId }).forUpdate().first(teamColumns);
  if (!team) throw new AppError(404, 'not_found', `There is no team ${teamId}; list the teams with GET /api/v1/teams.`);
  return team;
}

export async function createTeam(db: Db, actor: Caller, input: { slug: string; name: string } & TeamAddresses) {
  return db.transaction(async (trx) => {
    if (await trx('teams').where({ slug: input.slug }).first('id')) {
      throw new AppError(409, 'slug_taken', `A team with the slug "${input.slug}" exists already; pick another slug.`, 'slug');
    }
    const [team] = await trx('teams')
      .insert({ slug: input.slug, name: input.name, alert_email: input.alertEmail ?? null, escalation_email: input.escalationEmail ?? null })
      .returning(teamColumns);
    await recordAudit(trx, { actor, action: 'team.created', subjectType: 'team', subjectId: team.id, after: team });
    return { ...team, members: [] };
  });
}

/** Alert addresses: an owner of the team, an sre or an admin; the team's name: admins only. */
export async function updateTeam(db: Db, actor: Caller, teamId: number, change: { name?: string } & TeamAddresses) {
  return db.transaction(async (trx) => {
    const before = await teamForUpdate(trx, teamId);
    assertTeamAccess(actor, teamId, "change this team's alert addresses");
    if (change.name !== undefined && actor.role !== 'admin') {
      throw new AppError(403, 'forbidden', "Only an admin may rename a team; send only alertEmail and escalationEmail.", 'name');
    }
    const columns = {
      ...(change.name !== undefined ? { name: change.name } : {}),
      ...(change.alertEmail !== undefined ? { alert_email: change.alertEmail } : {}),
      ...(change.escalationEmail !== undefined ? { escalation_email: change.escalationEmail } : {}),
    };
    const [after] = await trx('teams').where({ id: teamId }).update({ ...columns, updated_at: trx.fn.now() }).returning(teamColumns);
    await recordAudit(trx, { actor, action: 'team.updated', subjectType: 'team', subjectId: teamId, before, after });
    return after;
  });
}

/** Adds a member, or changes whether they get the team's alert e-mail. */
export async function setMember(db: Db, actor: Caller, teamId: number, userId: number, wantsAlertMail: boolean) {
  return db.transaction(async (trx) => {
    await teamForUpdate(trx, teamId);
    const user = await trx('users').where({ id: userId }).first('id', 'login');
    if (!user) throw new AppError(404, 'not_found', `There is no user ${userId}; list the users with GET /api/v1/users.`, 'userId');
    const before = await trx('team_members').where({ team_id: teamId, user_id: userId }).first('wants_alert_mail as wantsAlertMail');
    await trx('team_members')
      .insert({ team_id: teamId, user_id: userId, wants_alert_mail: wantsAlertMail })
      .onConflict(['team_id', 'user_id'])
      .merge(['wants_alert_mail']);
    const after = { login: user.login, wantsAlertMail };
    await recordAudit(trx, { actor, action: before ? 'team.member_changed' : 'team.member_added', subjectType: 'team', subjectId: teamId, before: before ? { login: user.login, ...before } : null, after });
    return { teamId, userId, wantsAlertMail };
  });
}

export async function removeMember(db: Db, actor: Caller, teamId: number, userId: number) {
  return db.transaction(async (trx) => {
    await teamForUpdate(trx, teamId);
    const removed = await trx('team_members').where({ team_id: teamId, user_id: userId }).delete().returning(['user_id', 'wants_alert_mail']);
    if (removed.length === 0) throw new AppError(404, 'not_found', `User ${userId} is not a member of team ${teamId}.`, 'userId');
    const login = (await trx('users').where({ id: userId }).first('login'))?.login;
    await recordAudit(trx, { actor, action: 'team.member_removed', subjectType: 'team', subjectId: teamId, before: { login, wantsAlertMail: removed[0].wants_alert_mail } });
  });
}
