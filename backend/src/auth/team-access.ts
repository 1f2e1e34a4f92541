import { AppError } from '../http/errors';
import type { Caller } from './caller';
import { atLeast } from './roles';

/**
 * Per-item rule for things that belong to a team (sketches, alert addresses):
 * sre and admin act fleet-wide; an owner only on the teams they belong to.
 * Routes declare `allow('owner')` and then call `assertTeamAccess` with the item's team.
 */
export function canManageTeam(user: Caller, teamId: number): boolean {
  if (atLeast(user.role, 'sre')) return true;
  return user.role === 'owner' && user.teamIds.includes(Number(teamId));
}

/** Throws 403 unless the caller may change items of this team; `what` reads e.g. "edit this sketch". */
export function assertTeamAccess(user: Caller, teamId: number, what: string): void {
  if (canManageTeam(user, teamId)) return;
  const reason =
    user.role === 'owner'
      ? `it belongs to team ${teamId}, and you own only the sketches of your own teams (${user.teamIds.join(', ') || 'none yet'})`
      : `this needs the owner role on its team, or sre or admin; you are ${user.role}`;
  throw new AppError(403, 'not_your_team', `You may not ${what}: ${reason}. Ask an admin to add you to the team if you should.`);
}
