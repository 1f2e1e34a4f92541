import type { Knex } from 'knex';
import type { Caller } from '../auth/caller';

/** Who made a change: the caller of an API route, a person named by login (admin CLI), or the system itself. */
export type AuditActor = Caller | { login: string; id?: number | null } | 'system';

export interface AuditEntry {
  actor: AuditActor;
  /** Dotted, past tense, e.g. "user.role_changed", "token.created", "sketch.updated". */
  action: string;
  subjectType: string;
  subjectId?: string | number | null;
  before?: unknown;
  after?: unknown;
}

function actorColumns(actor: AuditActor): { actor_user_id: number | null; actor: string } {
  if (actor === 'system') return { actor_user_id: null, actor: 'system' };
  const viaToken = 'via' in actor && actor.via === 'token' ? ` (token:${actor.tokenLabel ?? actor.tokenId})` : '';
  return { actor_user_id: actor.id ?? null, actor: actor.login + viaToken };
}

const asJson = (value: unknown) => (value === undefined || value === null ? null : JSON.stringify(value));

/**
 * Writes one audit entry. Pass the transaction that makes the change, so the
 * entry and the change are stored together or not at all.
 */
export async function recordAudit(trx: Knex | Knex.Transaction, entry: AuditEntry): Promise<void> {
  await trx('audit_log').insert({
    ...actorColumns(entry.actor),
    action: entry.action,
    subject_type: entry.subjectType,
    subject_id: entry.subjectId === undefined || entry.subjectId === null ? null : String(entry.subjectId),
    before: asJson(entry.before),
    after: asJson(entry.after),
  });
}
