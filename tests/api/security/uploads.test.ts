import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signInEveryone, type Callers } from '../auth/callers';
import { jsonOf, startSignInWorld, type SignInWorld } from '../auth/sign-in-harness';
import { uploadForm } from '../dumps/upload-form';
import { dumpFormParts, rawUpload } from './raw-upload';

const LIMIT = 256 * 1024;
const BOUNDARY = 'brimwatch-upload-test';
const RAW_FIELDS = { format: 'u32le', width: 65536, depth: 8, errorBudget: 100, confidence: 0.99 };
const sleep = (ms: number) => new Promise((resolve) => setTimeout(resolve, ms));

describe('uploads refused cleanly, with the limits held while the bytes stream in', () => {
  let world: SignInWorld;
  let callers: Callers;
  const reports = async () => Number((await world.tdb.db('dump_reports').count('* as n').first())?.n);
  beforeAll(async () => {
    world = await startSignInWorld({ UPLOAD_MAX_BYTES: String(LIMIT), UPLOAD_IDLE_SECONDS: '1' });
    callers = await signInEveryone(world);
  });
  afterAll(async () => {
    await world?.close();
  });

  it('when a dump far over UPLOAD_MAX_BYTES streams in, then 413 comes back once the limit is passed, before the rest is sent, and nothing is stored', async () => {
    const { head, tail } = dumpFormParts(BOUNDARY, RAW_FIELDS, 'huge.u32');
    const fileBytes = 64 * 1024 * 1024;
    const chunk = Buffer.alloc(64 * 1024, 7);
    const answer = await rawUpload(world.appUrl, '/api/v1/dumps', callers.headers('token'), head.length + fileBytes + tail.length, BOUNDARY, async (write) => {
      await write(head);
      for (let sent = 0; sent < fileBytes; sent += chunk.length) {
        if (!(await write(chunk))) return;
        await sleep(2);
      }
      await write(tail);
    });
    expect(answer.status).toBe(413);
    expect(JSON.parse(answer.body).error).toMatchObject({ code: 'too_large', message: expect.stringMatching(/larger than the upload limit of .*UPLOAD_MAX_BYTES.*nothing was stored/) });
    // The refusal came while streaming: far less than the 64 MiB file had been sent.
    expect(answer.sentBeforeAnswer).toBeLessThan(8 * 1024 * 1024);
    expect(await reports()).toBe(0);
  });

  it('when the multipart body ends half-way through the file, then 400 says the upload is incomplete and nothing is stored', async () => {
    const { head } = dumpFormParts(BOUNDARY, RAW_FIELDS, 'cut.u32');
    const cut = Buffer.concat([head, Buffer.alloc(100_000, 1)]);
    const answer = await rawUpload(world.appUrl, '/api/v1/dumps', callers.headers('token'), cut.length, BOUNDARY, async (write) => {
      await write(cut);
    });
    expect(answer.status).toBe(400);
    expect(JSON.parse(answer.body).error).toMatchObject({ code: 'bad_upload', message: expect.stringMatching(/not a complete multipart\/form-data body.*send it again/) });
    expect(await reports()).toBe(0);
  });

  it('when the client hangs up half-way through the file, then the request is dropped and nothing is stored', async () => {
    const { head } = dumpFormParts(BOUNDARY, RAW_FIELDS, 'dropped.u32');
    const answer = await rawUpload(world.appUrl, '/api/v1/dumps', callers.headers('token'), head.length + 65536 * 8 * 4 + 100, BOUNDARY, async (write, end) => {
      await write(head);
      await write(Buffer.alloc(100_000, 1));
      end();
    });
    // Node's HTTP parser answers a body cut short with a bare 400 and closes; either way no report exists.
    expect([0, 400]).toContain(answer.status);
    expect(await reports()).toBe(0);
    expect((await fetch(`${world.appUrl}/api/health`)).status).toBe(200);
  });

  it('when an upload stalls, then after UPLOAD_IDLE_SECONDS it is refused with 408 saying nothing was stored, and the connection is let go', async () => {
    const { head } = dumpFormParts(BOUNDARY, RAW_FIELDS, 'slow.u32');
    const answer = await rawUpload(world.appUrl, '/api/v1/dumps', callers.headers('token'), head.length + 65536 * 8 * 4 + 100, BOUNDARY, async (write) => {
      await write(head);
      await write(Buffer.alloc(10_000, 1));
      // …and then nothing more, as a client on a dead link or one holding the connection on purpose.
    });
    expect(answer.status).toBe(408);
    expect(JSON.parse(answer.body).error).toMatchObject({ code: 'upload_stalled', message: expect.stringMatching(/nothing was stored/) });
    expect(answer.ms).toBeLessThan(10_000);
    expect(await reports()).toBe(0);
  });

  it('when the file is of the wrong type, not multipart, or in the wrong field, then 400 names what is wrong and nothing is stored', async () => {
    const png = new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, ...new Array(200).fill(0)]);
    const asCsv = await uploadForm(`${world.appUrl}/api/v1/dumps`, callers.headers('token'), { format: 'csv', errorBudget: 100, confidence: 0.99 }, { bytes: png, name: 'counters.csv' });
    expect(asCsv.status).toBe(400);
    expect((await jsonOf(asCsv)).error.message.length).toBeGreaterThan(20);

    const asJson = await fetch(`${world.appUrl}/api/v1/dumps`, { method: 'POST', headers: { ...callers.headers('token'), 'content-type': 'application/json' }, body: JSON.stringify({ counters: [1, 2, 3] }) });
    expect(asJson.status).toBe(400);
    expect((await jsonOf(asJson)).error.message).toMatch(/multipart\/form-data/);

    const form = new FormData();
    for (const [k, v] of Object.entries({ format: 'csv', errorBudget: 100, confidence: 0.99 })) form.append(k, String(v));
    form.append('attachment', new Blob(['1,2,3\n4,5,6\n']), 'dump.csv');
    const wrongField = await fetch(`${world.appUrl}/api/v1/dumps`, { method: 'POST', headers: callers.headers('token'), body: form });
    expect(wrongField.status).toBe(400);
    expect((await jsonOf(wrongField)).error.message).toMatch(/'file'/);
    expect(await reports()).toBe(0);
  });
});
