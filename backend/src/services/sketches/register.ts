import type { Caller } from '../../auth/caller';
import { assertTeamAccess } from '../../auth/team-access';
import { recordAudit } from '../../audit/record';
import type { Db } from '../../db';
import { AppError } from '../../http/errors';
import { DEFAULT_WATCH_LINE } from '../../maths/health-levels';
import { findService, findTeam, insertService, insertSketch, insertTargets, sketchExists, type TargetSpec } from '../../queries/sketches';
import type { RegistrationInput } from '../../routes/sketch-input';
import { instanceNameOf, isUniqueViolation, sketchSnapshot } from './snapshot';
import { checkTargetUrls, type TargetPolicy } from './target-check';

const DEFAULT_LEAD_TIME_DAYS = 7;
const DEFAULT_SCRAPE_INTERVAL_SECONDS = 30;

/** The targets a registration names: its replicas, or the one address under its host:port. */
export function targetsOf(input: { targetUrl?: string; instances?: { instance: string; targetUrl: string }[] }): TargetSpec[] {
  if (input.instances) {
    if (input.targetUrl !== undefined && !input.instances.some((i) => i.targetUrl === input.targetUrl)) {
      throw new AppError(400, 'invalid', 'targetUrl must be one of the addresses in instances, or be left out when instances lists the replicas.', 'targetUrl');
    }
    return input.instances.map((i) => ({ instance: i.instance, url: i.targetUrl }));
  }
  return [{ instance: instanceNameOf(input.targetUrl as string), url: input.targetUrl as string }];
}

/**
 * Registers a sketch of a team's service: the service is created for the team
 * if it is new, each target address must pass the target-safety check, and
 * the registration is audited in the same transaction.
 */
export async function registerSketch(db: Db, user: Caller, input: RegistrationInput, policy: TargetPolicy): Promise<number> {
  const targets = targetsOf(input);
  const team = await findTeam(db, input.team);
  if (!team) {
    const slugs = await db('teams').orderBy('slug').pluck('slug');
    throw new AppError(400, 'invalid', `team must be the slug of an existing team (${slugs.join(', ') || 'none yet; an admin creates teams'}); got ${input.team}.`, 'team');
  }
  assertTeamAccess(user, team.id, `register a sketch for team ${team.slug}`);
  await checkTargetUrls(targets.map((t) => t.url), input.instances !== undefined, policy);

  try {
    return await db.transaction(async (trx) => {
      const service = await findService(trx, input.service);
      if (service && Number(service.team_id) !== Number(team.id)) {
        const owner = await trx('teams').where({ id: service.team_id }).first('slug');
        throw new AppError(409, 'service_of_another_team', `The service ${input.service} belongs to team ${owner?.slug}, not ${team.slug}; register the sketch under team ${owner?.slug}, or pick another service name.`, 'service');
      }
      const serviceId = service ? Number(service.id) : await insertService(trx, input.service, team.id);
      if (await sketchExists(trx, serviceId, input.sketch)) throw duplicate(input.service, input.sketch);
      const id = await insertSketch(trx, serviceId, team.id, {
        name: input.sketch,
        error_budget: input.errorBudget,
        confidence: input.confidence,
        watch_line: input.watchLine ?? DEFAULT_WATCH_LINE,
        lead_time_days: input.leadTimeDays ?? DEFAULT_LEAD_TIME_DAYS,
        scrape_interval_seconds: input.scrapeIntervalSeconds ?? DEFAULT_SCRAPE_INTERVAL_SECONDS,
        sized_total: input.sizedTotal ?? null,
      });
      await insertTargets(trx, id, targets);
      await recordAudit(trx, { actor: user, action: 'sketch.registered', subjectType: 'sketch', subjectId: id, after: await sketchSnapshot(trx, id) });
      return id;
    });
  } catch (err) {
    if (isUniqueViolation(err, 'services_name_unique')) {
      throw new AppError(409, 'service_exists', `The service ${input.service} was registered by someone else at the same moment; send the request again.`, 'service');
    }
    if (isUniqueViolation(err)) throw duplicate(input.service, input.sketch);
    throw err;
  }
}

export function duplicate(service: string, sketch: string): AppError {
  return new AppError(409, 'sketch_exists', `The service ${service} already has a sketch named ${sketch}; pick another name, or change the existing one with PATCH.`, 'sketch');
}
