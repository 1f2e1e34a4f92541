import type { Knex } from 'knex';
import { recordAudit } from '../backend/src/audit/record';
import { loadConfig } from '../backend/src/config';
import { backfillTarget } from '../ops/demo-fleet/backfill';
import { DEMO_SKETCHES, metricsUrl } from '../ops/demo-fleet/scenario';

const BATCH = 500;

/**
 * Registers the demo fleet's sketches (ops/demo-fleet/scenario.ts) with one
 * target per instance at 127.0.0.1:DEMO_FLEET_PORT+n, and back-fills a week
 * of readings, judgements and the latest status per target, so the fleet's
 * charts and forecasts have something to show at once. The collectors carry
 * on from there against the live demo fleet.
 */
export async function seed(knex: Knex): Promise<void> {
  const { DEMO_FLEET_PORT } = loadConfig();
  const anchor = Date.now();
  for (const [s, spec] of DEMO_SKETCHES.entries()) {
    const team = await knex('teams').where({ slug: spec.team }).first('id');
    const service = await knex('services').where({ name: spec.service }).first('id');
    const [sketch] = await knex('sketches')
      .insert({
        service_id: service.id,
        team_id: team.id,
        name: spec.sketch,
        error_budget: spec.errorBudget,
        confidence: spec.confidence,
        scrape_interval_seconds: spec.scrapeIntervalSeconds,
        sized_total: spec.sizedTotal,
        created_at: new Date(anchor - 8 * 86_400_000),
      })
      .returning(['id', 'watch_line', 'lead_time_days']);
    for (const [i, instance] of spec.instances.entries()) {
      const url = metricsUrl(DEMO_FLEET_PORT, instance);
      const [target] = await knex('targets').insert({ sketch_id: sketch.id, url, instance: instance.name, created_at: new Date(anchor - 8 * 86_400_000) }).returning('id');
      const claimed = {
        targetId: Number(target.id),
        sketchId: Number(sketch.id),
        url,
        instance: instance.name,
        sketchLabel: spec.sketch,
        intervalSeconds: spec.scrapeIntervalSeconds,
        dueAt: new Date(anchor),
        errorBudget: spec.errorBudget,
        confidence: spec.confidence,
        watchLine: sketch.watch_line,
        leadTimeDays: sketch.lead_time_days,
      };
      const { readings, status } = backfillTarget(spec, instance, claimed, anchor, 1000 * (s + 1) + i);
      for (let at = 0; at < readings.length; at += BATCH) await knex('readings').insert(readings.slice(at, at + BATCH));
      await knex('target_status').insert(status);
    }
    const instances = spec.instances.map((instance) => ({ instance: instance.name, targetUrl: metricsUrl(DEMO_FLEET_PORT, instance) }));
    await recordAudit(knex, { actor: 'system', action: 'sketch.registered', subjectType: 'sketch', subjectId: sketch.id, after: { service: spec.service, sketch: spec.sketch, team: spec.team, instances } });
  }
}
