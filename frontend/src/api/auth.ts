import { get, isApiError, request } from './client';

export type Role = 'viewer' | 'responder' | 'owner' | 'sre' | 'admin';

export interface TeamRef {
  id: number;
  slug: string;
  name: string;
}

export interface SessionUser {
  id: number;
  login: string;
  name: string;
  email: string;
  role: Role;
  teams: TeamRef[];
}

/**
 * Where the browser goes to sign in; the server runs the OpenID Connect flow
 * and comes back to `returnTo`, a path of Brimwatch's own.
 */
export function signInUrl(returnTo: string): string {
  return `/api/auth/login?${new URLSearchParams({ returnTo })}`;
}

/** The signed-in user, or null when nobody is (401) or the server has no sign-in yet (404). */
export async function fetchCurrentUser(): Promise<SessionUser | null> {
  try {
    const answer = await get<{ user: SessionUser }>('/api/auth/me', { anonymousOk: true });
    return answer.user;
  } catch (error) {
    if (isApiError(error, 401) || isApiError(error, 404)) return null;
    throw error;
  }
}

export async function signOut(): Promise<void> {
  await request<null>('/api/auth/logout', { method: 'POST', anonymousOk: true });
}
