import http from 'node:http';
import type { AddressInfo } from 'node:net';
import { targetPage } from './sim-fleet';

/**
 * The simulated fleet, run as a process of its own so that the collector side
 * of every measurement has the benchmark's process to itself: GET /t/<n>
 * answers target n's page, its stream total growing with every request.
 */
const scrapes = new Map<number, number>();
const server = http.createServer((req, res) => {
  const match = /^\/t\/(\d+)$/.exec(req.url ?? '');
  if (!match) return void res.writeHead(404).end('no such target\n');
  const target = Number(match[1]);
  const n = (scrapes.get(target) ?? 0) + 1;
  scrapes.set(target, n);
  const page = targetPage(target, n);
  res.writeHead(200, { 'content-type': page.contentType, 'content-length': Buffer.byteLength(page.body) }).end(page.body);
});
server.listen(0, '127.0.0.1', () => {
  process.stdout.write(`${JSON.stringify({ port: (server.address() as AddressInfo).port })}\n`);
});
process.on('SIGTERM', () => server.close(() => process.exit(0)));
