import type { Db } from '../backend/src/db';

export interface CollectorIdentity {
  id: string;
  host: string;
  pid: number;
  startedAt: Date;
}

/** Records that this collector process is alive; the web server and the fleet page read it to show collectors' health. */
export async function recordHeartbeat(db: Db, me: CollectorIdentity, now = new Date()): Promise<void> {
  await db('collector_heartbeats')
    .insert({ collector_id: me.id, host: me.host, pid: me.pid, started_at: me.startedAt, beat_at: now })
    .onConflict('collector_id')
    .merge(['beat_at']);
}
