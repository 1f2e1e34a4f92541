import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startAlertJobs } from '../../../backend/src/alerts/alert-jobs';
import { enqueueMail } from '../../../backend/src/alerts/outbox';
import { seed as seedTeams } from '../../../seeds/01_teams_and_services';
import { createTestDatabase, testConfig, type TestDatabase } from '../../setup/database';
import { startMailFake, type MailFake } from './maildev';

describe('the alert jobs inside the collectors process', () => {
  let tdb: TestDatabase;
  let fake: MailFake;
  let jobs: { stop(): Promise<void> } | undefined;
  beforeAll(async () => {
    tdb = await createTestDatabase();
    await seedTeams(tdb.db);
    fake = await startMailFake();
  });
  afterAll(async () => {
    await jobs?.stop();
    await fake?.discard();
    await tdb?.drop();
  });

  it('when a message waits in the outbox, then the scheduled sender delivers it to the configured SMTP server and marks it sent', async () => {
    const team = await tdb.db('teams').where({ slug: 'discovery' }).first('id');
    await tdb.db.transaction((trx) =>
      enqueueMail(trx, { kind: 'digest', teamId: team.id, recipients: ['discovery-alerts@larkfield.test'], subject: '[Brimwatch] wiring check', text: 'plain', html: '<p>html</p>' }, new Date()),
    );
    const config = testConfig(tdb.url, { SMTP_HOST: '127.0.0.1', SMTP_PORT: String(fake.smtpPort) });
    jobs = startAlertJobs(tdb.db, config, () => {});
    let inbox = await fake.inbox();
    for (let i = 0; i < 60 && inbox.length === 0; i++) {
      await new Promise((r) => setTimeout(r, 500));
      inbox = await fake.inbox();
    }
    expect(inbox.map((m) => m.subject)).toEqual(['[Brimwatch] wiring check']);
    const row = await tdb.db('mail_outbox').first('sent_at', 'smtp_message_id');
    expect(row.sent_at).not.toBeNull();
    expect(row.smtp_message_id).toBe(inbox[0].headers['message-id']);
  }, 60_000);
});
