import type { InventoryColumn } from '../../api-types';

/**
 * The columns of an inventory file: one sketch per row, the same fields as
 * registering one sketch (POST /api/v1/sketches). The page documents them
 * from this list and the template is built from it, so they cannot drift.
 */
export const INVENTORY_COLUMNS: readonly InventoryColumn[] = [
  { name: 'service', required: 'yes', kind: 'text', meaning: 'The service that carries the sketch; a new name creates the service for the team.', example: 'checkout' },
  { name: 'sketch', required: 'yes', kind: 'text', meaning: "The sketch's `sketch` label in the service's exposition.", example: 'per-card-limiter' },
  { name: 'team', required: 'yes', kind: 'text', meaning: 'The slug of the owning team; owners may import only for their own teams.', example: 'payments' },
  { name: 'targetUrl', required: 'targetUrl or instances', kind: 'text', meaning: 'The http(s) address of the one endpoint that exposes the sketch.', example: 'http://127.0.0.1:9500/checkout/metrics' },
  { name: 'instances', required: 'targetUrl or instances', kind: 'instances', meaning: 'Several replicas instead: name=address pairs separated by spaces.', example: 'checkout-1=http://127.0.0.1:9501/metrics checkout-2=http://127.0.0.1:9502/metrics' },
  { name: 'errorBudget', required: 'yes', kind: 'number', meaning: "The largest overcount tolerated, in the stream's units.", example: '500' },
  { name: 'confidence', required: 'yes', kind: 'number', meaning: 'How sure the budget must hold, a fraction strictly between 0 and 1.', example: '0.99' },
  { name: 'watchLine', required: 'no', kind: 'number', meaning: 'The load at which the sketch turns watch (default 0.8).', example: '0.8' },
  { name: 'leadTimeDays', required: 'no', kind: 'number', meaning: 'How many days before the brim date to warn (default 7).', example: '7' },
  { name: 'scrapeIntervalSeconds', required: 'no', kind: 'number', meaning: 'How often to read the sketch, 5 to 86400 seconds (default 30).', example: '30' },
  { name: 'sizedTotal', required: 'no', kind: 'number', meaning: 'The stream total the sketch was sized for, if known.', example: '25000000' },
];

/** Header cells match whatever their case or separators: "Error budget", "error_budget" and "errorBudget" are one column. */
export const columnKey = (header: string) => header.toLowerCase().replace(/[\s_.-]/g, '');
