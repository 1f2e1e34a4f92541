import { describe, expect, it } from 'vitest';
import { registrationInput } from '../../../backend/src/routes/sketch-input';
import { SKETCH_RULES } from '@/components/sketch/form/sketch-form-rules';
import { figureOf } from '@/components/sketch/form/sketch-form-fields';

/** A registration the server accepts, to which one bad value at a time is added. */
const GOOD = { team: 'payments', service: 'checkout', sketch: 'card-velocity', targetUrl: 'http://127.0.0.1:9100/metrics', errorBudget: 500, confidence: 0.99 };

/** What the server says about this body: the first problem's field and message, as its 400 carries them. */
function serverSays(body: Record<string, unknown>): { field: string; message: string } | null {
  const parsed = registrationInput.safeParse(body);
  if (parsed.success) return null;
  const issue = parsed.error.issues[0];
  return { field: issue.path.join('.'), message: issue.message };
}

type Field = keyof typeof SKETCH_RULES;
const ruleSays = (field: Field, text: string) => SKETCH_RULES[field].map((rule) => rule(text)).find((answer) => answer !== true) ?? true;

/** Text typed into the form, and what the form sends for it (numbers as numbers). */
const REFUSED: [Field, string][] = [
  ['service', 'check out'],
  ['service', 'x'.repeat(101)],
  ['sketch', 'card velocity!'],
  ['targetUrl', 'ftp://10.0.4.7/metrics'],
  ['targetUrl', 'metrics.checkout'],
  ['errorBudget', '0'],
  ['errorBudget', '-5'],
  ['errorBudget', 'lots'],
  ['confidence', '1.5'],
  ['confidence', '1'],
  ['watchLine', '1.2'],
  ['leadTimeDays', '400'],
  ['scrapeIntervalSeconds', '2'],
  ['scrapeIntervalSeconds', '30.5'],
  ['sizedTotal', '-1'],
];

const sent = (field: Field, text: string) => (['service', 'sketch', 'targetUrl'].includes(field) ? text : figureOf(text));

describe('the register form\'s rules', () => {
  it.each(REFUSED)('when %s is "%s", then the form refuses it with the server\'s own message', (field, text) => {
    const server = serverSays({ ...GOOD, [field]: sent(field, text) });
    expect(server?.field).toBe(field);
    expect(ruleSays(field, text)).toBe(server?.message);
  });

  it('when a required figure is left blank, then the form says it is required, as the server does', () => {
    const { errorBudget: _left, ...withoutBudget } = GOOD;
    expect(ruleSays('errorBudget', '')).toBe(serverSays(withoutBudget)?.message);
    expect(ruleSays('errorBudget', '')).toMatch(/^errorBudget is required/);
  });

  it('when an optional figure is left blank, then the form lets the server use its default', () => {
    for (const field of ['watchLine', 'leadTimeDays', 'scrapeIntervalSeconds', 'sizedTotal'] as const) expect(ruleSays(field, '')).toBe(true);
  });

  it('when values the server accepts are typed, with digits grouped by spaces, then every rule passes', () => {
    const typed: [Field, string][] = [
      ['service', 'api-gateway'],
      ['sketch', 'partner:quota/v2'],
      ['targetUrl', 'https://10.0.4.7:9100/metrics'],
      ['errorBudget', '1 000'],
      ['confidence', '0.999'],
      ['watchLine', '1'],
      ['leadTimeDays', '0'],
      ['scrapeIntervalSeconds', '86 400'],
      ['sizedTotal', '5\u2009000\u2009000'],
    ];
    for (const [field, text] of typed) {
      expect(ruleSays(field, text), `${field} "${text}"`).toBe(true);
      expect(serverSays({ ...GOOD, [field]: sent(field, text) }), `${field} "${text}" on the server`).toBeNull();
    }
  });
});
