import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { signInEveryone, type Callers } from '../auth/callers';
import { jsonOf, startSignInWorld, type SignInWorld } from '../auth/sign-in-harness';
import { asCsv, asRaw, SMALL } from './dump-matrices';
import { uploadForm } from './upload-form';

type Case = [name: string, fields: Record<string, string | number>, bytes: Uint8Array | string, message: RegExp];

const budget = { errorBudget: 3, confidence: 0.9 };
const raw = asRaw(SMALL, 4);

// Each case: a file a person could really send, and the words the 400 must carry to say where it is wrong.
const CASES: Case[] = [
  ['a ragged CSV row', { format: 'csv' }, '1,2,3\n4,5\n', /Line 2 has 2 counters, but line 1 has 3/],
  ['a CSV row longer than the first', { format: 'csv' }, '1,2\n3,4,5\n', /Line 2 has more than 2 counters/],
  ['a negative CSV cell', { format: 'csv' }, '1,2\n3,-4\n', /line 2, cell 2: '-4' is negative/],
  ['a fractional CSV cell', { format: 'csv' }, '1,2.5\n3,4\n', /line 1, cell 2: '2.5' is not a whole number/],
  ['a CSV header line', { format: 'csv' }, 'c0,c1\n1,2\n', /line 1, cell 1: 'c0' is not a number/],
  ['an empty CSV cell', { format: 'csv' }, '1,,3\n', /line 1, cell 2 the cell is empty/],
  ['a trailing separator', { format: 'csv' }, '1,2,\n', /Line 1 ends with ','/],
  ['an empty line between rows', { format: 'csv' }, '1,2\n\n3,4\n', /Line 2 is empty/],
  ['a counter above 2^64 − 1', { format: 'csv' }, '1,99999999999999999999999\n', /line 1, cell 2: the counter 99999999999999999999999 is larger than 2\^64/],
  ['a file of one counter per line, past 64 rows', { format: 'csv' }, '1\n'.repeat(65), /Line 65 is row 65, but a dump holds at most 64 rows/],
  ['an empty file', { format: 'csv' }, '', /The file is empty/],
  ['a JSON ragged row', { format: 'json' }, '{"counters":[[1,2],[3]]}', /byte offset 21: row 2 of "counters" has 1 counters, but row 1 has 2/],
  ['a JSON negative counter', { format: 'json' }, '{"counters":[[1,2],[3,-4]]}', /byte offset 22 \(row 2, counter 2\): '-4' is negative/],
  ['a JSON fractional counter', { format: 'json' }, '{"width":2,"depth":1,"counters":[1,0.5]}', /byte offset 35 \(counter 2\): '0.5' is not a whole number/],
  ['a JSON counter in quotes', { format: 'json' }, '{"width":2,"depth":1,"counters":[1,"2"]}', /byte offset 35: a string was not expected here/],
  ['a flat JSON list of the wrong length', { format: 'json' }, '{"width":2,"depth":2,"counters":[1,2,3]}', /holds 3 counters, but width × depth = 2 × 2 = 4/],
  ['a flat JSON list without its shape', { format: 'json' }, '{"counters":[1,2,3]}', /must give "width" and "depth"/],
  ['JSON cut short', { format: 'json' }, '{"counters":[[1,2],[3,4]', /cut short/],
  ['JSON with a stray character', { format: 'json' }, '{"counters":[[1,2]]} x', /byte offset 21: 'x' is not JSON/],
  ['JSON whose width disagrees with its rows', { format: 'json' }, '{"width":3,"counters":[[1,2]]}', /"width" says 3, but each row of "counters" holds 2/],
  ['a raw file one byte short', { format: 'u32le', width: 4, depth: 2 }, raw.subarray(0, 31), /The file is 31 bytes, which is not even a whole number of 4-byte counters, but width × depth × 4 = 4 × 2 × 4 = 32 bytes/],
  ['a raw file too long for its shape', { format: 'u32le', width: 4, depth: 1 }, raw, /runs past byte offset 16, but width × depth × 4 = 4 × 1 × 4 = 16 bytes/],
  ['a raw 64-bit file read with 32-bit words of the wrong shape', { format: 'u64le', width: 4, depth: 2 }, raw, /The file is 32 bytes, but width × depth × 8 = 4 × 2 × 8 = 64 bytes/],
  ['a raw dump without its width', { format: 'u32le', depth: 2 }, raw, /width is required for a raw u32le dump/],
  ['a raw dump deeper than 64 rows', { format: 'u32le', width: 1, depth: 65 }, raw, /depth must be a whole number from 1 to 64/],
  ['a CSV file sent as raw counters', { format: 'u32le', width: 4, depth: 2 }, asCsv(SMALL), /looks like text, not raw little-endian 32-bit counters/],
  ['a JSON file sent as CSV', { format: 'csv' }, '{"counters":[[1]]}', /looks like JSON, not CSV\/TSV: choose the format json/],
  ['raw counters sent as CSV', { format: 'csv' }, raw, /binary data \(a control byte at byte offset 0\)/],
  ['CSV sent as JSON', { format: 'json' }, asCsv(SMALL), /not a JSON dump: it looks like CSV\/TSV/],
  ['an unknown format', { format: 'xlsx' }, asCsv(SMALL), /format is required and must come before the file in the form: one of csv, json, u32le, u64le/],
  ['a width given for CSV that the file contradicts', { format: 'csv', width: 5 }, asCsv(SMALL), /The form says width 5, but the file holds 2 rows of 4 counters/],
  ['a budget of zero', { format: 'csv', errorBudget: 0 }, asCsv(SMALL), /errorBudget must be a number greater than 0/],
];

describe('POST /api/v1/dumps with a malformed file or form', () => {
  let world: SignInWorld;
  let callers: Callers;
  beforeAll(async () => {
    world = await startSignInWorld();
    callers = await signInEveryone(world);
  });
  afterAll(async () => {
    await world.close();
  });

  it.each(CASES)('when the upload is %s, then it answers 400 saying where and why', async (_name, fields, bytes, message) => {
    const res = await uploadForm(`${world.appUrl}/api/v1/dumps`, callers.headers('responder'), { ...budget, ...fields }, { bytes, name: 'dump.csv' });
    const body = await jsonOf(res);
    expect(res.status, JSON.stringify(body)).toBe(400);
    expect(body.error.message).toMatch(message);
    expect(await world.tdb.db('dump_reports').count('id as n').first()).toEqual({ n: 0 });
  });

  it('when the file comes before the format field, then 400 says the fields go first', async () => {
    const res = await uploadForm(`${world.appUrl}/api/v1/dumps`, callers.headers('responder'), { format: 'csv', ...budget }, { bytes: asCsv(SMALL) }, { fileFirst: true });
    expect(res.status).toBe(400);
    expect((await jsonOf(res)).error).toMatchObject({ field: 'format', message: expect.stringMatching(/must come before the file/) });
  });

  it('when no file is attached, then 400 says how to send one', async () => {
    const res = await uploadForm(`${world.appUrl}/api/v1/dumps`, callers.headers('responder'), { format: 'csv', ...budget }, null);
    expect(res.status).toBe(400);
    expect((await jsonOf(res)).error).toMatchObject({ field: 'file', message: expect.stringMatching(/in the field 'file'/) });
  });

  it('when the file is in another field, then 400 names the field to use', async () => {
    const form = new FormData();
    form.append('format', 'csv');
    form.append('attachment', new Blob([asCsv(SMALL)]), 'dump.csv');
    const res = await fetch(`${world.appUrl}/api/v1/dumps`, { method: 'POST', headers: callers.headers('responder'), body: form });
    expect(res.status).toBe(400);
    expect((await jsonOf(res)).error.message).toMatch(/in the form field 'file'/);
  });

  it('when a file named .csv holds CSV but the name says .bin, then the name does not matter', async () => {
    const res = await uploadForm(`${world.appUrl}/api/v1/dumps`, callers.headers('responder'), { format: 'csv', ...budget }, { bytes: asCsv(SMALL), name: 'counters.bin' });
    expect(res.status).toBe(201);
  });
});

describe('POST /api/v1/dumps above UPLOAD_MAX_BYTES', () => {
  let world: SignInWorld;
  let callers: Callers;
  beforeAll(async () => {
    world = await startSignInWorld({ UPLOAD_MAX_BYTES: '4096' });
    callers = await signInEveryone(world);
  });
  afterAll(async () => {
    await world.close();
  });

  it('when the file is larger than the limit, then it answers 413 naming the limit and stores nothing', async () => {
    const big = '1,2,3,4\n'.repeat(4096); // 32 KiB, eight times the limit
    const res = await uploadForm(`${world.appUrl}/api/v1/dumps`, callers.headers('responder'), { format: 'csv', ...budget }, { bytes: big });
    expect(res.status).toBe(413);
    expect((await jsonOf(res)).error).toMatchObject({ code: 'too_large', message: expect.stringMatching(/upload limit of 4 KiB \(UPLOAD_MAX_BYTES\)/) });
    expect(await world.tdb.db('dump_reports').count('id as n').first()).toEqual({ n: 0 });
  });

  it('when the file is just under the limit, then it is checked as usual', async () => {
    const rows = '1,2,3,4\n'.repeat(64);
    const res = await uploadForm(`${world.appUrl}/api/v1/dumps`, callers.headers('responder'), { format: 'csv', ...budget }, { bytes: rows });
    expect(res.status).toBe(201);
  });
});
