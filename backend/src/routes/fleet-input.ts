import { z } from 'zod';
import { HEALTH_LEVELS_WORST_FIRST, type HealthLevel } from '../maths/health-levels';
import { FLEET_SORTS, type FleetSort } from '../services/sketches/fleet-table';

/** A query parameter given once, repeated, or comma-separated, as a list of non-empty values. */
export const list = z
  .union([z.string(), z.array(z.string())])
  .optional()
  .transform((v) => (v === undefined ? [] : [v].flat().flatMap((s) => s.split(',')).map((s) => s.trim()).filter(Boolean)));

export const wholeNumber = (field: string, low: number, high: number, fallback: number) => {
  const text = `${field} must be a whole number from ${low} to ${high}`;
  return z
    .string()
    .optional()
    .transform((v, ctx) => {
      if (v === undefined || v === '') return fallback;
      const n = Number(v);
      if (!Number.isInteger(n) || n < low || n > high) {
        ctx.addIssue({ code: 'custom', message: `${text} (got ${v}).` });
        return z.NEVER;
      }
      return n;
    });
};

const sortNames = Object.keys(FLEET_SORTS) as FleetSort[];
/** Names read best A→Z and brim dates soonest first; figures read best worst first. */
const ASCENDING_BY_DEFAULT: FleetSort[] = ['service', 'sketch', 'team', 'brimDate'];

export const fleetQueryInput = z
  .strictObject({
    team: list,
    service: list,
    level: list.refine((levels) => levels.every((l) => (HEALTH_LEVELS_WORST_FIRST as readonly string[]).includes(l)), {
      message: `level must be one or more of ${HEALTH_LEVELS_WORST_FIRST.join(', ')} (comma-separated or repeated).`,
    }),
    q: z.string('q must be one piece of text to search for').trim().max(200, 'q must be at most 200 characters').optional(),
    sort: z.enum(sortNames as [FleetSort, ...FleetSort[]], `sort must be one of ${sortNames.join(', ')}`).default('level'),
    order: z.enum(['asc', 'desc'], 'order must be asc or desc').optional(),
    page: wholeNumber('page', 1, 1_000_000, 1),
    pageSize: wholeNumber('pageSize', 1, 500, 50),
  })
  .transform((query) => ({
    ...query,
    levels: query.level as HealthLevel[],
    teams: query.team,
    services: query.service,
    q: query.q || undefined,
    order: query.order ?? (ASCENDING_BY_DEFAULT.includes(query.sort) ? ('asc' as const) : ('desc' as const)),
  }));

const DAY_MS = 86_400_000;
export const MAX_RANGE_DAYS = 400;

/** A time as ISO 8601 or milliseconds since the epoch. */
export const instant = (field: string) =>
  z
    .string()
    .optional()
    .transform((v, ctx) => {
      if (v === undefined || v === '') return undefined;
      const date = /^\d+$/.test(v) ? new Date(Number(v)) : new Date(v);
      if (Number.isNaN(date.getTime()) || !/^\d{4}-\d{2}-\d{2}|^\d+$/.test(v)) {
        ctx.addIssue({ code: 'custom', message: `${field} must be a time in ISO 8601 (2026-12-01T09:30:00Z) or milliseconds since 1970 (got ${v}).` });
        return z.NEVER;
      }
      return date;
    });

export const historyQueryInput = z
  .strictObject({
    from: instant('from'),
    to: instant('to'),
    points: wholeNumber('points', 1, 5000, 500),
    instance: z.string('instance must be the name of one of the sketch\'s instances').trim().min(1).max(200).optional(),
  })
  .transform((q, ctx) => {
    const to = q.to ?? new Date();
    const from = q.from ?? new Date(to.getTime() - 7 * DAY_MS);
    if (from >= to) {
      ctx.addIssue({ code: 'custom', path: ['from'], message: `from must be before to (got from ${from.toISOString()}, to ${to.toISOString()}).` });
      return z.NEVER;
    }
    if (to.getTime() - from.getTime() > MAX_RANGE_DAYS * DAY_MS) {
      ctx.addIssue({ code: 'custom', path: ['from'], message: `The range from … to must span at most ${MAX_RANGE_DAYS} days; narrow it.` });
      return z.NEVER;
    }
    return { from, to, points: q.points, instance: q.instance };
  });
