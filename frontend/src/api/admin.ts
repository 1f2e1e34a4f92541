// The admin API: users and roles, teams and their members, API tokens, the audit log.
import type { Role, TeamRef } from './auth';
import { get, request } from './client';

export const ROLES: readonly Role[] = ['viewer', 'responder', 'owner', 'sre', 'admin'];

export interface UserRow {
  id: number;
  login: string;
  name: string;
  email: string | null;
  role: Role;
  lastSignInAt: string | null;
  teams: Array<TeamRef & { wantsAlertMail: boolean }>;
}

export interface TeamMember {
  id: number;
  login: string;
  name: string;
  role: Role;
  wantsAlertMail: boolean;
}

export interface Team extends TeamRef {
  alertEmail: string | null;
  escalationEmail: string | null;
  members: TeamMember[];
}

export interface ApiToken {
  id: number;
  label: string;
  prefix: string;
  role: Role;
  createdAt: string;
  expiresAt: string;
  lastUsedAt: string | null;
  revokedAt: string | null;
  userId: number;
  userLogin: string;
}

export interface AuditRow {
  id: number;
  at: string;
  actor: string;
  action: string;
  subjectType: string;
  subjectId: string | null;
  before: unknown;
  after: unknown;
}

export interface AuditFilter {
  actor?: string;
  action?: string;
  subjectType?: string;
  subjectId?: string;
  from?: string;
  to?: string;
  page: number;
  pageSize: number;
}

export interface AuditPage {
  entries: AuditRow[];
  total: number;
  page: number;
  pageSize: number;
}

export const fetchUsers = async (): Promise<UserRow[]> => (await get<{ users: UserRow[] }>('/api/v1/users')).users;

export const changeRole = async (id: number, role: Role): Promise<void> => {
  await request(`/api/v1/users/${id}`, { method: 'PATCH', body: { role } });
};

export const fetchTeamsWithMembers = async (): Promise<Team[]> => (await get<{ teams: Team[] }>('/api/v1/teams')).teams;

export const createTeam = async (team: { slug: string; name: string; alertEmail?: string | null; escalationEmail?: string | null }): Promise<Team> =>
  (await request<{ team: Team }>('/api/v1/teams', { method: 'POST', body: team })).team;

export const changeTeam = async (id: number, change: { name?: string; alertEmail?: string | null; escalationEmail?: string | null }): Promise<void> => {
  await request(`/api/v1/teams/${id}`, { method: 'PATCH', body: change });
};

export const setMember = async (teamId: number, userId: number, wantsAlertMail: boolean): Promise<void> => {
  await request(`/api/v1/teams/${teamId}/members/${userId}`, { method: 'PUT', body: { wantsAlertMail } });
};

export const removeMember = async (teamId: number, userId: number): Promise<void> => {
  await request(`/api/v1/teams/${teamId}/members/${userId}`, { method: 'DELETE' });
};

export const fetchTokens = async (scope: 'own' | 'all'): Promise<ApiToken[]> =>
  (await get<{ tokens: ApiToken[] }>('/api/v1/tokens', { query: { scope } })).tokens;

/** The answer holds the secret: the only time the server ever sends it. */
export const createToken = (input: { label: string; role: Role; expiresInDays: number }): Promise<{ token: ApiToken; secret: string }> =>
  request('/api/v1/tokens', { method: 'POST', body: input });

export const revokeToken = async (id: number): Promise<void> => {
  await request(`/api/v1/tokens/${id}`, { method: 'DELETE' });
};

export const fetchAudit = (filter: AuditFilter): Promise<AuditPage> => get<AuditPage>('/api/v1/audit', { query: { ...filter } });
