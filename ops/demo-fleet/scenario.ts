import type { Growth } from './curves';

/**
 * Larkfield Market's sketches as the demo fleet runs them (an invented
 * scenario). Each instance is one HTTP server on loopback at DEMO_FLEET_PORT +
 * `port`; what it does decides the level the demo shows:
 *
 *   checkout   per-card-limiter      load 84 %, brims in about 5 days          → watch
 *   search     heavy-query-detector  conservative update, load 38 %           → clear
 *   ads        frequency-cap         hourly window, peaks past capacity       → brimmed
 *   gateway    per-key-quota         two replicas; gw-2 crosses 100 % about
 *                                    5 minutes after the start                → watch, then brimmed
 *   abuse      message-screen        stops answering 4 minutes after start    → clear, then unreachable
 *   abuse      signup-screen         its batch worker hangs; last good reading
 *                                    50 minutes before the start              → stale, then unreachable
 *   gateway    per-ip-burst          its proxy answers an HTML error page     → unreachable
 */
export type Behaviour = { kind: 'answers' } | { kind: 'stops'; afterSeconds: number } | { kind: 'hangs' } | { kind: 'garbage' };

export interface DemoInstance {
  name: string;
  /** Offset from DEMO_FLEET_PORT. */
  port: number;
  growth: Growth;
  behaviour: Behaviour;
}

export interface DemoSketch {
  service: string;
  team: string;
  sketch: string;
  width: number;
  depth: number;
  errorBudget: number;
  confidence: number;
  conservative: boolean;
  windowSeconds: number;
  scrapeIntervalSeconds: number;
  sizedTotal: number;
  /** The skewed traffic: Zipf over `keys` keys with exponent `skew`, keys named `${keyPrefix}-${rank}`. */
  keys: number;
  skew: number;
  keyPrefix: string;
  /** Good readings stop this long before the start (the back-filled history's gap). */
  silentForMinutes?: number;
  /** The back-filled history turns to failed readings this long before the start. */
  failingForHours?: number;
  instances: DemoInstance[];
}

export const DEMO_SKETCHES: DemoSketch[] = [
  {
    service: 'checkout', team: 'payments', sketch: 'per-card-limiter',
    width: 27_183, depth: 5, errorBudget: 100, confidence: 0.99, conservative: false, windowSeconds: 0,
    scrapeIntervalSeconds: 30, sizedTotal: 1_000_000, keys: 60_000, skew: 1.05, keyPrefix: 'card',
    instances: [{ name: 'checkout-1', port: 0, growth: { kind: 'cumulative', loadWeekAgo: 0.6, loadNow: 0.84 }, behaviour: { kind: 'answers' } }],
  },
  {
    service: 'search', team: 'discovery', sketch: 'heavy-query-detector',
    width: 5437, depth: 4, errorBudget: 1000, confidence: 0.98, conservative: true, windowSeconds: 0,
    scrapeIntervalSeconds: 30, sizedTotal: 2_000_000, keys: 40_000, skew: 1.2, keyPrefix: 'query',
    instances: [{ name: 'search-1', port: 1, growth: { kind: 'cumulative', loadWeekAgo: 0.22, loadNow: 0.38 }, behaviour: { kind: 'answers' } }],
  },
  {
    service: 'ads-ranking', team: 'ads', sketch: 'frequency-cap',
    width: 2719, depth: 3, errorBudget: 100, confidence: 0.95, conservative: false, windowSeconds: 3600,
    scrapeIntervalSeconds: 30, sizedTotal: 100_000, keys: 20_000, skew: 0.9, keyPrefix: 'shopper-ad',
    instances: [{ name: 'ads-ranking-1', port: 2, growth: { kind: 'windowed', peakLoadWeekAgo: 0.95, peakLoadNow: 1.25, windowSeconds: 3600 }, behaviour: { kind: 'answers' } }],
  },
  {
    service: 'api-gateway', team: 'edge', sketch: 'per-key-quota',
    width: 10_874, depth: 5, errorBudget: 1000, confidence: 0.99, conservative: false, windowSeconds: 0,
    scrapeIntervalSeconds: 30, sizedTotal: 4_000_000, keys: 5000, skew: 1.1, keyPrefix: 'partner-key',
    instances: [
      { name: 'gw-1', port: 3, growth: { kind: 'restarts', peakLoadWeekAgo: 0.75, peakLoadNow: 1.02, periodHours: 24, lastRestartHoursAgo: 9 }, behaviour: { kind: 'answers' } },
      { name: 'gw-2', port: 4, growth: { kind: 'restarts', peakLoadWeekAgo: 0.75, peakLoadNow: 1.02, periodHours: 24, lastRestartHoursAgo: 23.45 }, behaviour: { kind: 'answers' } },
    ],
  },
  {
    service: 'abuse-screen', team: 'trust', sketch: 'message-screen',
    width: 2719, depth: 4, errorBudget: 50, confidence: 0.98, conservative: false, windowSeconds: 0,
    scrapeIntervalSeconds: 30, sizedTotal: 50_000, keys: 8000, skew: 1.0, keyPrefix: 'sender',
    instances: [{ name: 'abuse-screen-1', port: 5, growth: { kind: 'cumulative', loadWeekAgo: 0.5, loadNow: 0.7 }, behaviour: { kind: 'stops', afterSeconds: 240 } }],
  },
  {
    service: 'abuse-screen', team: 'trust', sketch: 'signup-screen',
    width: 1360, depth: 3, errorBudget: 100, confidence: 0.95, conservative: false, windowSeconds: 0,
    scrapeIntervalSeconds: 900, sizedTotal: 50_000, keys: 4000, skew: 1.0, keyPrefix: 'signup-ip', silentForMinutes: 50,
    instances: [{ name: 'abuse-screen-batch', port: 6, growth: { kind: 'cumulative', loadWeekAgo: 0.45, loadNow: 0.55 }, behaviour: { kind: 'hangs' } }],
  },
  {
    service: 'api-gateway', team: 'edge', sketch: 'per-ip-burst',
    width: 2719, depth: 4, errorBudget: 200, confidence: 0.98, conservative: false, windowSeconds: 0,
    scrapeIntervalSeconds: 30, sizedTotal: 200_000, keys: 30_000, skew: 1.0, keyPrefix: 'client-ip', failingForHours: 3,
    instances: [{ name: 'edge-proxy-1', port: 7, growth: { kind: 'cumulative', loadWeekAgo: 0.3, loadNow: 0.45 }, behaviour: { kind: 'garbage' } }],
  },
];

/** What the misconfigured proxy in front of per-ip-burst answers instead of the exposition. */
export const GARBAGE_BODY = '<html><head><title>502 Bad Gateway</title></head><body><h1>502 Bad Gateway</h1></body></html>\n';

export const metricsUrl = (basePort: number, instance: DemoInstance) => `http://127.0.0.1:${basePort + instance.port}/metrics`;
