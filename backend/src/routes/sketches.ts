import { Router, type Request } from 'express';
import type { Config } from '../config';
import type { Db } from '../db';
import { allow } from '../auth/permission';
import type { Caller } from '../auth/caller';
import { AppError } from '../http/errors';
import { parseInput } from '../http/validate';
import { changeSketch, removeSketch } from '../services/sketches/change';
import { sketchDetail } from '../services/sketches/detail';
import { listFleet } from '../services/sketches/fleet';
import type { FleetSnapshot } from '../services/sketches/fleet-snapshot';
import { sketchHistory } from '../services/sketches/history';
import { registerSketch } from '../services/sketches/register';
import { targetPolicyOf } from '../services/sketches/target-check';
import { testTarget } from '../services/sketches/test-target';
import { fleetQueryInput, historyQueryInput } from './fleet-input';
import { idParam } from './id-param';
import { changeInput, registrationInput, testTargetInput } from './sketch-input';

const caller = (req: Request): Caller => req.user as Caller;

/**
 * The fleet API. Reading is for every role; registering, changing and deleting
 * a sketch is for the owners of its team and for sre and admin (checked per
 * sketch after the route's declaration lets owners in).
 */
export function sketchRoutes(db: Db, config: Config, snapshot: FleetSnapshot): Router {
  const router = Router();
  const policy = targetPolicyOf(config);

  router.get('/v1/sketches', allow('viewer'), async (req, res) => {
    const query = parseInput(fleetQueryInput, req.query, 'query');
    res.json(await listFleet(db, snapshot, { ...query, now: new Date() }));
  });

  router.post('/v1/sketches', allow('owner'), async (req, res) => {
    const input = parseInput(registrationInput, req.body, 'body');
    const id = await registerSketch(db, caller(req), input, policy);
    snapshot.invalidate();
    res.status(201).location(`/api/v1/sketches/${id}`).json(await sketchDetail(db, id, new Date()));
  });

  router.post('/v1/sketches/test-target', allow('owner'), async (req, res) => {
    const input = parseInput(testTargetInput, req.body, 'body');
    res.json(await testTarget(input, policy));
  });

  router.get('/v1/sketches/:id', allow('viewer'), async (req, res) => {
    res.json(await sketchDetail(db, idParam(req.params.id, 'sketch'), new Date()));
  });

  router.get('/v1/sketches/:id/readings', allow('viewer'), async (req, res) => {
    const id = idParam(req.params.id, 'sketch');
    res.json(await sketchHistory(db, id, parseInput(historyQueryInput, req.query, 'query')));
  });

  router.patch('/v1/sketches/:id', allow('owner'), async (req, res) => {
    const id = idParam(req.params.id, 'sketch');
    for (const field of ['service', 'team'] as const) {
      if (req.body && typeof req.body === 'object' && field in req.body) {
        throw new AppError(400, 'invalid', `A sketch cannot move to another ${field}; register it there and delete this one.`, field);
      }
    }
    await changeSketch(db, caller(req), id, parseInput(changeInput, req.body, 'body'), policy);
    snapshot.invalidate();
    res.json(await sketchDetail(db, id, new Date()));
  });

  router.delete('/v1/sketches/:id', allow('owner'), async (req, res) => {
    await removeSketch(db, caller(req), idParam(req.params.id, 'sketch'));
    snapshot.invalidate();
    res.status(204).end();
  });

  return router;
}
