// What the Admin page offers to whom. A convenience only: the server decides every request.
import type { Role, SessionUser } from '@/api/auth';
import { ROLES } from '@/api/admin';

export const atLeast = (role: Role, floor: Role): boolean => ROLES.indexOf(role) >= ROLES.indexOf(floor);

export const isAdmin = (user: SessionUser | null): boolean => user?.role === 'admin';

/** Alert addresses: an owner for their own teams, sre and admin for any. */
export function canEditAddresses(user: SessionUser | null, teamId: number): boolean {
  if (!user) return false;
  if (atLeast(user.role, 'sre')) return true;
  return user.role === 'owner' && user.teams.some((t) => t.id === teamId);
}

/** A token carries its maker's role or less. */
export const tokenRoles = (user: SessionUser | null): Role[] => (user ? ROLES.filter((r) => atLeast(user.role, r)) : []);
