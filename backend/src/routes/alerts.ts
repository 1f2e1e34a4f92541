import { Router } from 'express';
import { acknowledgeAlert, alertDetail, listAlerts, sketchAlerts } from '../alerts/alert-service';
import { createQuietWindow, endQuietWindow, listQuietWindows } from '../alerts/quiet-windows';
import { allow } from '../auth/permission';
import type { Db } from '../db';
import { parseInput } from '../http/validate';
import { acknowledgeInput, alertListInput, quietListInput, quietWindowInput } from './alert-input';
import { idParam } from './id-param';

/**
 * Alerts and quiet windows. Everyone reads them; a responder or above
 * acknowledges alerts and sets or ends quiet windows (on-call covers every
 * team, so these are not limited to one's own teams).
 */
export function alertRoutes(db: Db): Router {
  const router = Router();

  router.get('/v1/alerts', allow('viewer'), async (req, res) => {
    res.json(await listAlerts(db, parseInput(alertListInput, req.query, 'query'), new Date()));
  });
  router.get('/v1/alerts/:id', allow('viewer'), async (req, res) => {
    res.json(await alertDetail(db, idParam(req.params.id, 'alert'), new Date()));
  });
  router.post('/v1/alerts/:id/acknowledge', allow('responder'), async (req, res) => {
    const { note } = parseInput(acknowledgeInput, req.body, 'body');
    res.json(await acknowledgeAlert(db, req.user!, idParam(req.params.id, 'alert'), note || null, new Date()));
  });
  router.get('/v1/sketches/:id/alerts', allow('viewer'), async (req, res) => {
    res.json(await sketchAlerts(db, idParam(req.params.id, 'sketch'), new Date()));
  });

  router.get('/v1/quiet-windows', allow('viewer'), async (req, res) => {
    res.json(await listQuietWindows(db, parseInput(quietListInput, req.query, 'query'), new Date()));
  });
  router.post('/v1/quiet-windows', allow('responder'), async (req, res) => {
    const window = await createQuietWindow(db, req.user!, parseInput(quietWindowInput, req.body, 'body'), new Date());
    res.status(201).location(`/api/v1/quiet-windows/${window.id}`).json({ quietWindow: window });
  });
  router.delete('/v1/quiet-windows/:id', allow('responder'), async (req, res) => {
    res.json({ quietWindow: await endQuietWindow(db, req.user!, idParam(req.params.id, 'quiet window'), new Date()) });
  });
  return router;
}
