import type { Knex } from 'knex';
import { recordAudit, type AuditActor } from '../../audit/record';
import type { Caller } from '../../auth/caller';
import { atLeast, type Role } from '../../auth/roles';
import type { Db } from '../../db';
import { AppError } from '../../http/errors';
import { hashTokenSecret, newTokenSecret, tokenPrefix } from '../../tokens/token-secret';

const view = (trx: Knex) =>
  trx('api_tokens as t')
    .join('users as u', 'u.id', 't.user_id')
    .select(
      't.id', 't.label', 't.prefix', 't.role', 't.created_at as createdAt', 't.expires_at as expiresAt',
      't.last_used_at as lastUsedAt', 't.revoked_at as revokedAt', 'u.id as userId', 'u.login as userLogin',
    );

export interface NewToken {
  userId: number;
  label: string;
  role: Role;
  expiresInDays: number;
}

/**
 * Makes a token for a user and returns its secret, the only time it exists
 * outside the caller's hands: only its hash is stored. The role may not exceed the user's own.
 */
export async function createToken(db: Db, actor: AuditActor, input: NewToken) {
  return db.transaction(async (trx) => {
    const user = await trx('users').where({ id: input.userId }).first('id', 'login', 'role');
    if (!user) throw new AppError(404, 'not_found', `There is no user ${input.userId}.`);
    if (!atLeast(user.role, input.role)) {
      throw new AppError(403, 'role_too_high', `A token cannot carry more than its owner's role: ${user.login} is ${user.role}, the token asked for ${input.role}.`, 'role');
    }
    const secret = newTokenSecret();
    const expiresAt = new Date(Date.now() + input.expiresInDays * 86_400_000);
    const [{ id }] = await trx('api_tokens').insert(
      { user_id: user.id, label: input.label, token_hash: hashTokenSecret(secret), prefix: tokenPrefix(secret), role: input.role, expires_at: expiresAt },
      ['id'],
    );
    const token = await view(trx).where('t.id', id).first();
    await recordAudit(trx, { actor, action: 'token.created', subjectType: 'token', subjectId: id, after: { label: input.label, role: input.role, owner: user.login, expiresAt } });
    return { token, secret };
  });
}

export async function listTokens(db: Db, caller: Caller, scope: 'own' | 'all') {
  if (scope === 'all' && caller.role !== 'admin') {
    throw new AppError(403, 'forbidden', `Only an admin may list everyone's tokens; you are ${caller.role}. Leave out scope=all to list your own.`, 'scope');
  }
  const query = view(db).orderBy('t.created_at', 'desc');
  return scope === 'all' ? query : query.where('t.user_id', caller.id);
}

/** Revokes a token for good; its owner or an admin may. Revoking twice changes nothing. */
export async function revokeToken(db: Db, caller: Caller, tokenId: number) {
  return db.transaction(async (trx) => {
    const token = await trx('api_tokens').where({ id: tokenId }).forUpdate().first('id', 'user_id', 'label', 'revoked_at');
    if (!token) throw new AppError(404, 'not_found', `There is no token ${tokenId}; list yours with GET /api/v1/tokens.`);
    if (token.user_id !== caller.id && caller.role !== 'admin') {
      throw new AppError(403, 'forbidden', 'You may revoke only your own tokens; an admin may revoke anyone\'s.');
    }
    if (!token.revoked_at) {
      await trx('api_tokens').where({ id: tokenId }).update({ revoked_at: trx.fn.now(), revoked_by: caller.id });
      await recordAudit(trx, { actor: caller, action: 'token.revoked', subjectType: 'token', subjectId: tokenId, before: { label: token.label, revokedAt: null }, after: { label: token.label, revoked: true } });
    }
    return view(trx).where('t.id', tokenId).first();
  });
}
