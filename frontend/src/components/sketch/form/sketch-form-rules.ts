// The form's rules are the server's own: the same zod schemas the API checks
// a registration with (backend/src/routes/sketch-input.ts), so a value the
// server would refuse is refused here first, with the server's own words.
import '../../../utils/zod-without-eval';
import type { z } from 'zod';
import { instanceList, serviceName, sketchName, targetUrl, tunables } from '../../../../../backend/src/routes/sketch-input';
import { figureOf } from './sketch-form-fields';

export type Rule = (text: string) => true | string;

function ruleOf(schema: z.ZodType, read: (text: string) => unknown = (text) => text): Rule {
  return (text) => {
    const parsed = schema.safeParse(read(text ?? ''));
    return parsed.success || parsed.error.issues[0].message;
  };
}

const figure = (text: string) => figureOf(text);
/** A blank optional figure is left out of the request, so the server's default applies. */
const optionalFigure = (schema: z.ZodType): Rule => {
  const rule = ruleOf(schema, figure);
  return (text) => figureOf(text ?? '') === undefined || rule(text);
};

export const requireTeam: Rule = (slug) => (slug ? true : 'team is required: must be the slug of a team, such as payments');

export const SKETCH_RULES = {
  service: [ruleOf(serviceName)],
  sketch: [ruleOf(sketchName)],
  team: [requireTeam],
  targetUrl: [ruleOf(targetUrl())],
  instance: [ruleOf(instanceList.element.shape.instance)],
  errorBudget: [ruleOf(tunables.errorBudget, figure)],
  confidence: [ruleOf(tunables.confidence, figure)],
  watchLine: [optionalFigure(tunables.watchLine)],
  leadTimeDays: [optionalFigure(tunables.leadTimeDays)],
  scrapeIntervalSeconds: [optionalFigure(tunables.scrapeIntervalSeconds)],
  sizedTotal: [optionalFigure(tunables.sizedTotal)],
} satisfies Record<string, Rule[]>;
