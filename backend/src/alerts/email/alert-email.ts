import type { AlertState, NoticeKind } from '../notify-decision';
import type { AlertLevel } from '../../api-types';
import { CAUTION, figureRows, resizeSection, type AlertFacts } from './alert-facts';
import { renderText, type MailDocument, type MailSection } from './document';
import { formatLoad, formatSpan, formatWhen } from './figures';
import { LEVEL_SENTENCE } from './levels';
import { renderHtml } from './render-html';

export interface AlertMailInput {
  alert: {
    id: number;
    level: AlertLevel;
    state: AlertState;
    openedAt: Date;
    levelSince: Date;
    clearSince: Date | null;
    resolvedAt: Date | null;
  };
  kind: NoticeKind;
  escalate: boolean;
  facts: AlertFacts;
  publicUrl: string;
  now: Date;
}

function loadWord(input: AlertMailInput): string {
  const { facts, alert } = input;
  if (alert.state !== 'resolved' && alert.level === 'unreachable') return 'scrapes failing';
  if (alert.state !== 'resolved' && alert.level === 'stale') return 'no recent reading';
  return facts.load === null ? 'no reading' : formatLoad(facts.load);
}

/** Short and sortable: the level leads, then service / sketch, then the headline figure. */
export function alertSubject(input: AlertMailInput): string {
  const { facts, alert, kind, escalate } = input;
  const where = `${facts.service} / ${facts.sketch}`;
  if (kind === 'resolved') return `[Brimwatch] resolved · ${where} · ${loadWord(input)}`;
  const level = escalate ? `${alert.level}, unacknowledged` : alert.level;
  return `[Brimwatch] ${level} · ${where} · ${loadWord(input)}${kind === 'repeat' ? ' · reminder' : ''}`;
}

function intro(input: AlertMailInput): string[] {
  const { alert, kind, now, escalate } = input;
  const opened = `The alert opened at ${formatWhen(alert.openedAt)}.`;
  const lines: Record<NoticeKind, string> = {
    opened: `An alert opened for this sketch at ${formatWhen(alert.openedAt)}.`,
    rose: `The alert rose to ${alert.level} at ${formatWhen(alert.levelSince)}. ${opened}`,
    repeat: `Still ${alert.level} since ${formatWhen(alert.levelSince)}, and nobody has acknowledged it. ${opened}`,
    escalated: `Brimmed for ${formatSpan(now.getTime() - alert.levelSince.getTime())} and not acknowledged: this message also goes to the team's escalation address.`,
    resolved: `Resolved at ${formatWhen(alert.resolvedAt)}: the sketch has been clear since ${formatWhen(alert.clearSince)}. ${opened}`,
  };
  const out = [lines[kind], kind === 'resolved' ? LEVEL_SENTENCE.clear : LEVEL_SENTENCE[alert.level]];
  if (escalate && kind !== 'escalated') out.push("It is brimmed and unacknowledged past the escalation delay, so the team's escalation address has a copy.");
  return out;
}

function acknowledgeSection(input: AlertMailInput): MailSection {
  const base = input.publicUrl;
  const page = `${base}/sketches/${input.facts.id}`;
  if (input.alert.state === 'resolved') return { title: 'Where to look', paragraphs: [`The sketch's page: ${page}`] };
  return {
    title: 'What to do',
    paragraphs: [
      `The sketch's page, with its history and this plan: ${page}`,
      'Acknowledging stops the reminders; a rise in level is still sent.',
      `Acknowledge on the Alerts page (${base}/alerts), or from a script with an API token (responder or above):`,
    ],
    code: `curl -X POST ${base}/api/v1/alerts/${input.alert.id}/acknowledge \\\n  -H "Authorization: Bearer $BRIMWATCH_TOKEN" -H "Content-Type: application/json" \\\n  -d '{"note": "resizing today"}'`,
  };
}

export function alertDocument(input: AlertMailInput): MailDocument {
  const resolved = input.kind === 'resolved';
  const sections: MailSection[] = [{ title: 'The sketch now', rows: figureRows(input.facts) }];
  if (!resolved) sections.push(resizeSection(input.facts));
  sections.push(acknowledgeSection(input));
  return {
    level: resolved ? 'clear' : input.alert.level,
    badgeText: resolved ? 'resolved' : input.alert.level,
    heading: `${input.facts.service} / ${input.facts.sketch}`,
    intro: intro(input),
    sections,
    caution: CAUTION,
  };
}

export function composeAlertMail(input: AlertMailInput): { subject: string; text: string; html: string } {
  const doc = alertDocument(input);
  return { subject: alertSubject(input), text: renderText(doc), html: renderHtml(doc) };
}
