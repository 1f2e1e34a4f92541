import type { Knex } from 'knex';

export interface OutgoingMail {
  kind: 'alert' | 'digest';
  alertId?: number;
  teamId: number;
  recipients: string[];
  subject: string;
  text: string;
  html: string;
  /** Where several processes may decide the same message, the second insert is dropped. */
  dedupeKey?: string;
}

/**
 * Puts a message in the outbox, in the caller's transaction: if the alert
 * change rolls back, so does the message, and if it commits, the sender will
 * deliver it however long the mail server is away. Returns null when a
 * message with the same dedupe key is already there.
 */
export async function enqueueMail(trx: Knex.Transaction, mail: OutgoingMail, now: Date): Promise<number | null> {
  const rows = await trx('mail_outbox')
    .insert({
      kind: mail.kind,
      alert_id: mail.alertId ?? null,
      team_id: mail.teamId,
      dedupe_key: mail.dedupeKey ?? null,
      recipients: mail.recipients,
      subject: mail.subject,
      text_body: mail.text,
      html_body: mail.html,
      next_attempt_at: now,
      created_at: now,
    })
    .onConflict('dedupe_key')
    .ignore()
    .returning('id');
  return rows.length ? Number(rows[0].id) : null;
}
