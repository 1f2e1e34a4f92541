import { recordAudit } from '../../audit/record';
import { ROLES, isRole, type Role } from '../../auth/roles';
import type { IdClaims } from '../../auth/oidc-client';
import type { Db } from '../../db';
import { AppError } from '../../http/errors';

/** The highest Brimwatch role named in the provider's `roles` claim; viewer when it names none. */
export function roleFromClaim(roles: string[]): Role {
  const known = roles.filter(isRole);
  return known.reduce<Role>((best, r) => (ROLES.indexOf(r) > ROLES.indexOf(best) ? r : best), 'viewer');
}

/**
 * Creates or updates the user from a checked ID token and records the
 * sign-in. The role comes from the provider only the first time; after that
 * admins manage it in Brimwatch. A row made earlier for the same login (the
 * admin CLI does this) is linked to the provider's subject on first sign-in.
 */
export async function recordSignIn(db: Db, claims: IdClaims): Promise<number> {
  return db.transaction(async (trx) => {
    let user = await trx('users').where({ subject: claims.subject }).forUpdate().first();
    if (!user) {
      user = await trx('users').where({ login: claims.login }).forUpdate().first();
      if (user?.subject && user.subject !== claims.subject) {
        throw new AppError(409, 'login_taken', `Another person already signed in with the login "${claims.login}"; ask an admin to sort out the two accounts.`);
      }
    }
    const profile = { subject: claims.subject, name: claims.name, email: claims.email, last_sign_in_at: trx.fn.now(), updated_at: trx.fn.now() };
    if (!user) {
      const role = roleFromClaim(claims.roles);
      const [created] = await trx('users').insert({ ...profile, login: claims.login, role }, ['id', 'login', 'name', 'email', 'role']);
      await recordAudit(trx, { actor: { id: created.id, login: created.login }, action: 'user.created', subjectType: 'user', subjectId: created.id, after: { login: created.login, name: created.name, email: created.email, role } });
      user = created;
    } else {
      await trx('users').where({ id: user.id }).update(profile);
    }
    await recordAudit(trx, { actor: { id: user.id, login: user.login }, action: 'user.signed_in', subjectType: 'user', subjectId: user.id });
    return Number(user.id);
  });
}
