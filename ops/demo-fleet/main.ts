import { loadConfig } from '../../backend/src/config';
import { FedSketch } from './fed-sketch';
import { startInstanceServer, type InstanceServer } from './instance-server';
import { DEMO_SKETCHES } from './scenario';

/**
 * The demo fleet (started by `npm start` when DEMO is on): Larkfield Market's
 * services, one HTTP server per instance on 127.0.0.1 from DEMO_FLEET_PORT up,
 * each carrying real count-min sketches fed once a second with seeded Zipf
 * traffic along the curves of scenario.ts.
 */
const config = loadConfig();
const startedAt = Date.now();
const LIVE_DRAWS_PER_SECOND = 40;
const CATCH_UP_DRAWS = 20_000;

const fed = DEMO_SKETCHES.flatMap((spec, s) => spec.instances.map((instance, i) => new FedSketch(spec, instance, startedAt, 1000 * (s + 1) + i)));
for (const f of fed) f.feedTo(startedAt, CATCH_UP_DRAWS);

const byPort = new Map<number, FedSketch[]>();
for (const f of fed) byPort.set(f.instance.port, [...(byPort.get(f.instance.port) ?? []), f]);

const servers: InstanceServer[] = [];
for (const [offset, sketches] of byPort) {
  const port = config.DEMO_FLEET_PORT + offset;
  try {
    servers.push(await startInstanceServer(port, sketches, sketches[0].instance.behaviour, startedAt));
  } catch (err) {
    console.error(
      `[demo-fleet] cannot listen on 127.0.0.1:${port} (DEMO_FLEET_PORT + ${offset}): ${(err as Error).message}. ` +
        `Fix: free ports ${config.DEMO_FLEET_PORT}-${config.DEMO_FLEET_PORT + byPort.size - 1}, set DEMO_FLEET_PORT to a free range, or set DEMO=false.`,
    );
    process.exit(1);
  }
}
const feeder = setInterval(() => {
  const now = Date.now();
  for (const f of fed) f.feedTo(now, LIVE_DRAWS_PER_SECOND);
}, 1000);

const names = DEMO_SKETCHES.map((s) => `${s.service}/${s.sketch}`).join(', ');
console.log(`[demo-fleet] ${servers.length} instances on 127.0.0.1:${config.DEMO_FLEET_PORT}-${config.DEMO_FLEET_PORT + servers.length - 1}: ${names}`);

let stopping = false;
const shutdown = async () => {
  if (stopping) return;
  stopping = true;
  clearInterval(feeder);
  await Promise.all(servers.map((s) => s.close()));
  process.exit(0);
};
process.on('SIGINT', shutdown);
process.on('SIGTERM', shutdown);
