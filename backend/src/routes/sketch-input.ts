import { z } from 'zod';

/**
 * The fields of a sketch as the API takes them. Each rule's message says what
 * is accepted, so the 400 reads as the fix; a missing field says it is required.
 */
const rule = (field: string, text: string) => ({
  error: (issue: { input?: unknown }) => (issue.input === undefined ? `${field} is required: ${text}` : `${field} ${text}`),
});

const finite = (field: string, text: string) => z.number(rule(field, text)).refine(Number.isFinite, `${field} ${text}`);

const NAME = /^[A-Za-z0-9][A-Za-z0-9._-]*$/;
const LABEL = /^[A-Za-z0-9_.:/-]+$/;
const INSTANCE = /^[A-Za-z0-9_.:[\]-]+$/;

const serviceText = "must be a service name of letters, digits, '.', '_' or '-' (at most 100 characters), such as checkout";
const sketchText = "must be the sketch's `sketch` label: letters, digits, '_', '.', ':', '/' or '-' (at most 200 characters), such as per-card-limiter";
const urlText = 'must be the http:// or https:// address of the endpoint that exposes the sketch, such as http://10.0.4.7:9100/metrics';
const instanceText = "must name the replica in letters, digits, '_', '.', ':', '[', ']' or '-' (at most 200 characters), such as checkout-1 or 10.0.4.7:9100";

export const serviceName = z.string(rule('service', serviceText)).trim().max(100, `service ${serviceText}`).regex(NAME, `service ${serviceText}`);
export const sketchName = z.string(rule('sketch', sketchText)).trim().max(200, `sketch ${sketchText}`).regex(LABEL, `sketch ${sketchText}`);
const teamName = z.string(rule('team', 'must be the slug of a team, such as payments')).trim().min(1, 'team must be the slug of a team, such as payments');

export const targetUrl = (field = 'targetUrl') =>
  z
    .string(rule(field, urlText))
    .trim()
    .max(2000, `${field} ${urlText}`)
    .refine((value) => {
      try {
        const url = new URL(value);
        return (url.protocol === 'http:' || url.protocol === 'https:') && url.hostname !== '';
      } catch {
        return false;
      }
    }, `${field} ${urlText}`);

const errorBudget = finite('errorBudget', "must be a number greater than 0: the largest overcount tolerated, in the stream's units (e.g. 500)").refine(
  (v) => v > 0,
  "errorBudget must be a number greater than 0: the largest overcount tolerated, in the stream's units (e.g. 500)",
);
const confidenceText = 'must be a fraction strictly between 0 and 1, such as 0.99 for 99 %';
const confidence = finite('confidence', confidenceText).refine((v) => v > 0 && v < 1, `confidence ${confidenceText}`);
const watchText = 'must be a fraction above 0 and at most 1, such as 0.8 (warn at 80 % load)';
const watchLine = finite('watchLine', watchText).refine((v) => v > 0 && v <= 1, `watchLine ${watchText}`);
const leadText = 'must be a number of days from 0 to 365, such as 7';
const leadTimeDays = finite('leadTimeDays', leadText).refine((v) => v >= 0 && v <= 365, `leadTimeDays ${leadText}`);
const intervalText = 'must be a whole number of seconds from 5 to 86400, such as 30';
const scrapeIntervalSeconds = finite('scrapeIntervalSeconds', intervalText).refine((v) => Number.isInteger(v) && v >= 5 && v <= 86_400, `scrapeIntervalSeconds ${intervalText}`);
const sizedText = 'must be a number greater than 0 (the stream total the sketch was sized for), or null';
const sizedTotal = finite('sizedTotal', sizedText).refine((v) => v > 0, `sizedTotal ${sizedText}`).nullable();

const instance = z.strictObject({
  instance: z.string(rule('instance', instanceText)).trim().max(200, `instance ${instanceText}`).regex(INSTANCE, `instance ${instanceText}`),
  targetUrl: targetUrl(),
});

const instancesText = 'must list 1 to 64 replicas as [{ "instance": "checkout-1", "targetUrl": "http://…" }], each name and address once';
export const instanceList = z
  .array(instance, rule('instances', instancesText))
  .min(1, `instances ${instancesText}`)
  .max(64, `instances ${instancesText}`)
  .refine((list) => new Set(list.map((i) => i.instance)).size === list.length, `instances ${instancesText}: an instance name appears twice`)
  .refine((list) => new Set(list.map((i) => i.targetUrl)).size === list.length, `instances ${instancesText}: a targetUrl appears twice`);

export const tunables = { errorBudget, confidence, watchLine, leadTimeDays, scrapeIntervalSeconds, sizedTotal };

export const registrationInput = z
  .strictObject({
    service: serviceName,
    sketch: sketchName,
    team: teamName,
    targetUrl: targetUrl().optional(),
    errorBudget,
    confidence,
    watchLine: watchLine.optional(),
    leadTimeDays: leadTimeDays.optional(),
    scrapeIntervalSeconds: scrapeIntervalSeconds.optional(),
    sizedTotal: sizedTotal.optional(),
    instances: instanceList.optional(),
  })
  .refine((body) => body.targetUrl !== undefined || body.instances !== undefined, {
    path: ['targetUrl'],
    message: `targetUrl is required (or list the replicas in instances): it ${urlText}`,
  });

export type RegistrationInput = z.infer<typeof registrationInput>;

/** Everything but the service and team can change; moving a sketch is a new registration. */
export const changeInput = z.strictObject({
  sketch: sketchName.optional(),
  targetUrl: targetUrl().optional(),
  instances: instanceList.optional(),
  errorBudget: errorBudget.optional(),
  confidence: confidence.optional(),
  watchLine: watchLine.optional(),
  leadTimeDays: leadTimeDays.optional(),
  scrapeIntervalSeconds: scrapeIntervalSeconds.optional(),
  sizedTotal: sizedTotal.optional(),
});

export type ChangeInput = z.infer<typeof changeInput>;

/** "Test the target": the address and sketch label to read; with a budget and confidence, the load is worked out too. */
export const testTargetInput = z.strictObject({
  targetUrl: targetUrl(),
  sketch: sketchName,
  errorBudget: errorBudget.optional(),
  confidence: confidence.optional(),
  watchLine: watchLine.optional(),
});

export type TestTargetInput = z.infer<typeof testTargetInput>;
