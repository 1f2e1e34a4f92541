import type { Db } from '../db';
import type { Clock } from './clock';
import type { MailTransport } from './mail-transport';

export interface SenderOptions {
  from: string;
  retryBaseMs: number;
  retryMaxMs: number;
  /** The most rows one tick sends, so one tick never runs for long. */
  batch?: number;
}

/** Exponential backoff after the n-th failed attempt: base, 2·base, 4·base … capped. */
export function retryDelayMs(attempts: number, baseMs: number, maxMs: number): number {
  return Math.min(maxMs, baseMs * 2 ** Math.max(0, attempts - 1));
}

/** The same row always carries the same Message-ID, so a receiver can tell a duplicate (see drainOutbox). */
export function messageIdOf(rowId: number, from: string): string {
  const domain = /@([^>\s]+)/.exec(from)?.[1] ?? 'brimwatch.invalid';
  return `<outbox-${rowId}@${domain}>`;
}

export interface DrainResult {
  sent: number;
  failed: number;
}

/**
 * Sends what is due in the outbox, one row per transaction: the row is
 * claimed with FOR UPDATE SKIP LOCKED (so several collector processes share
 * the work and never send the same row at once), sent, and marked sent with
 * the message id before the lock is let go. A failure counts the attempt,
 * keeps the error and puts the next try off by exponential backoff; nothing
 * is ever dropped.
 *
 * Delivery is at least once: if the process dies after the server accepted
 * a message and before the mark commits, the row is sent again on the next
 * tick. The Message-ID is stable per row, so the copy is recognisable.
 */
export async function drainOutbox(db: Db, transport: MailTransport, clock: Clock, options: SenderOptions): Promise<DrainResult> {
  const result: DrainResult = { sent: 0, failed: 0 };
  for (let i = 0; i < (options.batch ?? 20); i++) {
    const outcome = await db.transaction(async (trx) => {
      const now = clock.now();
      const row = await trx('mail_outbox')
        .whereNull('sent_at')
        .where('next_attempt_at', '<=', now)
        .orderBy([{ column: 'next_attempt_at' }, { column: 'id' }])
        .forUpdate()
        .skipLocked()
        .first('id', 'recipients', 'subject', 'text_body', 'html_body', 'attempts');
      if (!row) return 'empty';
      const attempts = Number(row.attempts) + 1;
      try {
        const info = await transport.send({
          from: options.from,
          to: row.recipients,
          subject: row.subject,
          text: row.text_body,
          html: row.html_body,
          messageId: messageIdOf(Number(row.id), options.from),
        });
        await trx('mail_outbox').where({ id: row.id }).update({ attempts, sent_at: clock.now(), smtp_message_id: info.messageId, last_error: null });
        return 'sent';
      } catch (err) {
        const wait = retryDelayMs(attempts, options.retryBaseMs, options.retryMaxMs);
        await trx('mail_outbox')
          .where({ id: row.id })
          .update({ attempts, last_error: err instanceof Error ? err.message : String(err), next_attempt_at: new Date(now.getTime() + wait) });
        return 'failed';
      }
    });
    if (outcome === 'empty') break;
    result[outcome] += 1;
  }
  return result;
}
