import { Router } from 'express';
import { Gauge, Registry } from 'prom-client';
import type { Config } from '../config';
import type { Db } from '../db';
import { allow } from '../auth/permission';
import { identifyCaller } from '../auth/identify';
import { HEALTH_LEVELS_WORST_FIRST } from '../maths/health-levels';
import type { FleetRow } from '../queries/fleet';
import type { FleetSnapshot } from '../services/sketches/fleet-snapshot';

/**
 * The web server's own /metrics, so an existing metrics system can watch the
 * fleet through Brimwatch: sketches per level and the load of every sketch.
 * It names every service and sketch, so it is for viewers and up: a scraper
 * sends a viewer's API token as "Authorization: Bearer <token>".
 */
export function metricsRoutes(db: Db, config: Config, snapshot: FleetSnapshot): Router {
  const registry = new Registry();
  let rows: FleetRow[] = [];
  new Gauge({
    name: 'brimwatch_sketches',
    help: 'Sketches at each level (the worst instance decides).',
    labelNames: ['level'],
    registers: [registry],
    collect() {
      this.reset();
      for (const level of HEALTH_LEVELS_WORST_FIRST) this.set({ level }, rows.filter((r) => r.level === level).length);
    },
  });
  new Gauge({
    name: 'brimwatch_sketch_load',
    help: 'Stream total over capacity of the worst instance (1 = the error budget no longer holds).',
    labelNames: ['service', 'sketch', 'team'],
    registers: [registry],
    collect() {
      this.reset();
      for (const r of rows) if (r.load !== null) this.set({ service: r.service, sketch: r.sketch, team: r.team }, r.load);
    },
  });

  const router = Router();
  router.use('/metrics', identifyCaller(db, config.SESSION_ABSOLUTE_HOURS * 3600_000));
  router.get('/metrics', allow('viewer'), async (_req, res) => {
    // Both gauges read the same snapshot (prom-client collects them concurrently).
    rows = await snapshot.rows();
    const body = await registry.metrics();
    res.type(registry.contentType).send(body);
  });
  return router;
}
