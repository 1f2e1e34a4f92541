import type { HealthLevel } from '../../maths/health-levels';
import { renderText, type MailDocument, type MailSection } from './document';
import { formatBytes, formatCount, formatLoad, formatWhen } from './figures';
import { CAUTION, LEVEL_SHAPE } from './levels';
import { renderHtml } from './render-html';

export interface DigestSketch {
  service: string;
  sketch: string;
  level: HealthLevel;
  load: number | null;
  brimDate: string | null;
  brimEarliest: string | null;
  brimLatest: string | null;
  /** The proposed new size and what it adds across the sketch's instances; null when no resize is proposed. */
  resize: { width: number; depth: number; addsBytes: number } | null;
}

export interface DigestFacts {
  team: { slug: string; name: string };
  day: string;
  now: Date;
  publicUrl: string;
  sketchCount: number;
  /** The team's sketches on watch or worse, worst first. */
  troubled: DigestSketch[];
  /** The team's sketches whose brim date falls within the next 30 days, soonest first. */
  brimmingSoon: DigestSketch[];
  teamMemoryBytes: number;
  teamResizeAddsBytes: number;
  fleetMemoryBytes: number;
  fleetResizeAddsBytes: number;
  fleetSketchCount: number;
}

const plus = (bytes: number) => `${bytes >= 0 ? '+' : ''}${formatBytes(bytes)}`;
const resizeCell = (s: DigestSketch) => (s.resize ? `${formatCount(s.resize.width)} × ${s.resize.depth} (${plus(s.resize.addsBytes)})` : '—');

export function digestSubject(f: DigestFacts): string {
  return `[Brimwatch] digest · ${f.team.name} · ${f.day} · ${f.troubled.length} on watch or worse, ${f.brimmingSoon.length} brim within 30 days`;
}

export function digestDocument(f: DigestFacts): MailDocument {
  const sections: MailSection[] = [];
  sections.push(
    f.troubled.length
      ? {
          title: 'On watch or worse',
          table: {
            head: ['Level', 'Service / sketch', 'Load', 'Brim date', 'Resize to'],
            rows: f.troubled.map((s) => [`${LEVEL_SHAPE[s.level]} ${s.level}`, `${s.service} / ${s.sketch}`, formatLoad(s.load), s.brimDate ? formatWhen(s.brimDate) : '—', resizeCell(s)]),
            figureColumns: [2, 3, 4],
          },
        }
      : { title: 'On watch or worse', paragraphs: ['None: every sketch of the team is clear.'] },
  );
  sections.push(
    f.brimmingSoon.length
      ? {
          title: 'Brim dates within 30 days',
          table: {
            head: ['Service / sketch', 'Brim date', 'Earliest', 'Latest'],
            rows: f.brimmingSoon.map((s) => [`${s.service} / ${s.sketch}`, formatWhen(s.brimDate), formatWhen(s.brimEarliest), s.brimLatest ? formatWhen(s.brimLatest) : 'no later bound']),
            figureColumns: [1, 2, 3],
          },
        }
      : { title: 'Brim dates within 30 days', paragraphs: ['None of the team’s sketches is forecast to brim within 30 days.'] },
  );
  sections.push({
    title: 'Memory',
    rows: [
      { label: `${f.team.name} now`, value: `${formatBytes(f.teamMemoryBytes)} across ${f.sketchCount} sketches, all instances`, figure: true },
      { label: 'Proposed resizes add', value: plus(f.teamResizeAddsBytes), figure: true },
      { label: 'Whole fleet now', value: `${formatBytes(f.fleetMemoryBytes)} across ${f.fleetSketchCount} sketches`, figure: true },
      { label: 'Fleet resizes add', value: plus(f.fleetResizeAddsBytes), figure: true },
    ],
    paragraphs: ['Each resize is sized for the trend’s stream total in 90 days plus 25 % headroom, at the same error budget and confidence.'],
  });
  sections.push({
    title: 'Where to look',
    paragraphs: [`The team’s sketches: ${f.publicUrl}/fleet?team=${encodeURIComponent(f.team.slug)}`, `Open alerts: ${f.publicUrl}/alerts`],
  });
  const worst = f.troubled[0]?.level;
  return {
    level: worst,
    badgeText: worst ? `${f.troubled.length} on watch or worse` : undefined,
    heading: `Daily digest for ${f.team.name}, ${f.day}`,
    intro: [`${f.sketchCount} sketches watched; ${f.troubled.length} on watch or worse; ${f.brimmingSoon.length} forecast to brim within 30 days.`],
    sections,
    caution: CAUTION,
  };
}

export function composeDigestMail(f: DigestFacts): { subject: string; text: string; html: string } {
  const doc = digestDocument(f);
  return { subject: digestSubject(f), text: renderText(doc), html: renderHtml(doc) };
}
