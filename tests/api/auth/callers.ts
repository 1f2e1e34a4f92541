import { ROLES, type Role } from '../../../backend/src/auth/roles';
import { CookieJar, jsonOf, signInThroughProvider, step, type SignInWorld } from './sign-in-harness';

export type CallerName = 'anonymous' | Role | 'token';
export const CALLERS: CallerName[] = ['anonymous', ...ROLES, 'token'];

export interface Callers {
  /** Request headers that make a request come from this caller. */
  headers(caller: CallerName): Record<string, string>;
  userId(login: Role): number;
  /** The bearer token's role: the sre's own. */
  tokenRole: Role;
}

/** Signs in every demo account through the provider, and makes an API token as the sre (in the browser, as a person would). */
export async function signInEveryone(world: SignInWorld): Promise<Callers> {
  const jars = new Map<Role, CookieJar>();
  for (const role of ROLES) jars.set(role, (await signInThroughProvider(world, role)).jar);
  const made = await step(jars.get('sre')!, `${world.appUrl}/api/v1/tokens`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ label: 'route table' }),
  });
  if (made.status !== 201) throw new Error(`could not make a token: ${made.status} ${await made.text()}`);
  const { secret } = await jsonOf(made);
  const ids = new Map<string, number>((await world.tdb.db('users').select('id', 'login')).map((u) => [u.login, Number(u.id)]));
  return {
    headers: (caller): Record<string, string> => {
      if (caller === 'anonymous') return {};
      if (caller === 'token') return { authorization: `Bearer ${secret}` };
      return { cookie: jars.get(caller)!.header() };
    },
    userId: (login) => ids.get(login)!,
    tokenRole: 'sre',
  };
}
