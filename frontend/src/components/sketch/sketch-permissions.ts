// What the page offers to whom. Only a convenience: the server checks every
// change (owner: own teams only; sre and admin: any sketch).
import type { Role, SessionUser } from '@/api/auth';

const MANAGES_ANY_TEAM: readonly Role[] = ['sre', 'admin'];

export function canRegisterSketches(user: SessionUser | null): boolean {
  return user !== null && (user.role === 'owner' || MANAGES_ANY_TEAM.includes(user.role));
}

/** `team` is the sketch's team slug. */
export function canEditSketch(user: SessionUser | null, team: string): boolean {
  if (user === null) return false;
  if (MANAGES_ANY_TEAM.includes(user.role)) return true;
  return user.role === 'owner' && user.teams.some((t) => t.slug === team);
}

/** The teams a user may register sketches for: their own as owner, every team as sre or admin. */
export function teamsToRegisterFor<T extends { slug: string }>(user: SessionUser | null, teams: T[]): T[] {
  if (user === null) return [];
  if (MANAGES_ANY_TEAM.includes(user.role)) return teams;
  return user.role === 'owner' ? teams.filter((t) => user.teams.some((own) => own.slug === t.slug)) : [];
}

/** A sketch's own audit entries are open to everyone signed in (the whole log is for admins). */
export function canReadAudit(user: SessionUser | null): boolean {
  return user !== null;
}
