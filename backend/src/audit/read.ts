import type { Db } from '../db';

export interface AuditFilter {
  actor?: string;
  action?: string;
  subjectType?: string;
  subjectId?: string;
  from?: Date;
  to?: Date;
  page: number;
  pageSize: number;
}

/**
 * One page of the audit log, newest first. `actor` matches a login (also its
 * token calls); `action` matches exactly, or every action under it when it ends with "." (e.g. "token.").
 */
export async function readAudit(db: Db, filter: AuditFilter) {
  const query = db('audit_log as a').leftJoin('users as u', 'u.id', 'a.actor_user_id');
  if (filter.actor) query.where((w) => w.where('a.actor', filter.actor!).orWhere('u.login', filter.actor!));
  if (filter.action) {
    if (filter.action.endsWith('.')) query.where('a.action', 'like', `${filter.action.replace(/[\\%_]/g, '\\$&')}%`);
    else query.where('a.action', filter.action);
  }
  if (filter.subjectType) query.where('a.subject_type', filter.subjectType);
  if (filter.subjectId) query.where('a.subject_id', filter.subjectId);
  if (filter.from) query.where('a.at', '>=', filter.from);
  if (filter.to) query.where('a.at', '<', filter.to);

  const [{ total }] = await query.clone().count<{ total: string }[]>('a.id as total');
  const entries = await query
    .orderBy([{ column: 'a.at', order: 'desc' }, { column: 'a.id', order: 'desc' }])
    .limit(filter.pageSize)
    .offset((filter.page - 1) * filter.pageSize)
    .select('a.id', 'a.at', 'a.actor', 'a.actor_user_id as actorUserId', 'a.action', 'a.subject_type as subjectType', 'a.subject_id as subjectId', 'a.before', 'a.after');
  return { entries, total: Number(total), page: filter.page, pageSize: filter.pageSize };
}
