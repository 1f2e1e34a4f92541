// What the register/change form holds (text, as typed) and the request body
// it becomes. Digits may be grouped with spaces, thin spaces or underscores.
import type { ChangeInput, RegistrationInput } from '@/api/sketches';
import type { SketchDetail } from '@brimwatch/api-types';

export interface Replica {
  instance: string;
  targetUrl: string;
}

export interface SketchFormFields {
  team: string;
  service: string;
  sketch: string;
  /** One address, or several replicas each with a name and an address. */
  replicated: boolean;
  targetUrl: string;
  replicas: Replica[];
  errorBudget: string;
  confidence: string;
  watchLine: string;
  leadTimeDays: string;
  scrapeIntervalSeconds: string;
  sizedTotal: string;
}

/** The server's defaults for the optional settings, shown so nobody guesses them. */
export const NEW_SKETCH: SketchFormFields = {
  team: '',
  service: '',
  sketch: '',
  replicated: false,
  targetUrl: '',
  replicas: [{ instance: '', targetUrl: '' }],
  errorBudget: '',
  confidence: '0.99',
  watchLine: '0.8',
  leadTimeDays: '7',
  scrapeIntervalSeconds: '30',
  sizedTotal: '',
};

/**
 * A typed figure as the number it stands for; blank is undefined, and text
 * that is no number stays text so the server's rule reports it as such.
 */
export function figureOf(text: string): number | string | undefined {
  const compact = text.replace(/[\s\u2009\u202F_]/g, '');
  if (compact === '') return undefined;
  const value = Number(compact);
  return Number.isNaN(value) ? text : value;
}

export function fieldsFromDetail(d: SketchDetail): SketchFormFields {
  const replicas = d.instances.map((i) => ({ instance: i.instance, targetUrl: i.targetUrl }));
  return {
    team: d.team,
    service: d.service,
    sketch: d.sketch,
    replicated: replicas.length > 1,
    targetUrl: replicas[0]?.targetUrl ?? '',
    replicas: replicas.length ? replicas : [{ instance: '', targetUrl: '' }],
    errorBudget: String(d.errorBudget),
    confidence: String(d.confidence),
    watchLine: String(d.watchLine),
    leadTimeDays: String(d.leadTimeDays),
    scrapeIntervalSeconds: String(d.scrapeIntervalSeconds),
    sizedTotal: d.sizedTotal === null ? '' : String(d.sizedTotal),
  };
}

function where(f: SketchFormFields): Pick<RegistrationInput, 'targetUrl' | 'instances'> {
  if (!f.replicated) return { targetUrl: f.targetUrl.trim() };
  return { instances: f.replicas.map((r) => ({ instance: r.instance.trim(), targetUrl: r.targetUrl.trim() })) };
}

function tunables(f: SketchFormFields) {
  return {
    errorBudget: figureOf(f.errorBudget),
    confidence: figureOf(f.confidence),
    watchLine: figureOf(f.watchLine),
    leadTimeDays: figureOf(f.leadTimeDays),
    scrapeIntervalSeconds: figureOf(f.scrapeIntervalSeconds),
  };
}

// The casts hand text that is not a number to the server, whose answer names the field.
export function registrationBody(f: SketchFormFields): RegistrationInput {
  const sizedTotal = figureOf(f.sizedTotal);
  return {
    team: f.team,
    service: f.service.trim(),
    sketch: f.sketch.trim(),
    ...where(f),
    ...tunables(f),
    ...(sizedTotal === undefined ? {} : { sizedTotal }),
  } as RegistrationInput;
}

/** Every changeable field is sent; a blank sized total clears it. */
export function changeBody(f: SketchFormFields): ChangeInput {
  return { sketch: f.sketch.trim(), ...where(f), ...tunables(f), sizedTotal: figureOf(f.sizedTotal) ?? null } as ChangeInput;
}
