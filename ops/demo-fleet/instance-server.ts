import http from 'node:http';
import type { AddressInfo, Socket } from 'node:net';
import { Registry, type RegistryContentType } from 'prom-client';
import { sketchExporter } from '../../collectors/exporter';
import type { FedSketch } from './fed-sketch';
import { GARBAGE_BODY, type Behaviour } from './scenario';

export interface InstanceServer {
  port: number;
  close(): Promise<void>;
}

function registryFor(contentType: RegistryContentType, sketches: FedSketch[]): Registry<RegistryContentType> {
  const registry = new Registry<RegistryContentType>();
  registry.setContentType(contentType);
  const exporter = sketchExporter(registry);
  for (const fed of sketches) exporter.add(fed.spec.sketch, fed.sketch, { windowSeconds: fed.spec.windowSeconds });
  return registry;
}

/**
 * One simulated service instance (port 0 picks a free port): serves its sketches on GET /metrics through
 * prom-client and Brimwatch's exporter, in OpenMetrics when the scraper asks
 * for it, else in the Prometheus text format. Its behaviour can make it stop
 * answering (the connection stays open, no reply), or answer an HTML page.
 */
export async function startInstanceServer(port: number, sketches: FedSketch[], behaviour: Behaviour, startedAt: number): Promise<InstanceServer> {
  const registries = { openMetrics: registryFor(Registry.OPENMETRICS_CONTENT_TYPE, sketches), prometheus: registryFor(Registry.PROMETHEUS_CONTENT_TYPE, sketches) };
  const silent = () => behaviour.kind === 'hangs' || (behaviour.kind === 'stops' && Date.now() - startedAt >= behaviour.afterSeconds * 1000);
  const sockets = new Set<Socket>();

  const server = http.createServer(async (req, res) => {
    if (silent()) return; // the scraper times out, as it would against a hung process
    if (req.method !== 'GET' || req.url?.split('?')[0] !== '/metrics') {
      res.writeHead(404, { 'content-type': 'text/plain' }).end('Only GET /metrics is served here.\n');
      return;
    }
    if (behaviour.kind === 'garbage') {
      res.writeHead(200, { 'content-type': 'text/html' }).end(GARBAGE_BODY);
      return;
    }
    const registry = (req.headers.accept ?? '').includes('application/openmetrics-text') ? registries.openMetrics : registries.prometheus;
    const body = await registry.metrics();
    res.writeHead(200, { 'content-type': registry.contentType }).end(body);
  });
  server.on('connection', (socket) => {
    sockets.add(socket);
    socket.on('close', () => sockets.delete(socket));
  });
  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(port, '127.0.0.1', () => resolve());
  });
  return {
    port: (server.address() as AddressInfo).port,
    close: () =>
      new Promise<void>((resolve) => {
        for (const socket of sockets) socket.destroy();
        server.close(() => resolve());
      }),
  };
}
