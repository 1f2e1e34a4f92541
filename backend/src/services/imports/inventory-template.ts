import { csvRecord } from '../csv/csv-write';
import { INVENTORY_COLUMNS } from './inventory-columns';

const example = (name: string) => INVENTORY_COLUMNS.find((c) => c.name === name)!.example;

/**
 * The downloadable starting point: the header row and two sketches of the
 * demo marketplace, one with a single address and one with two replicas.
 */
export function inventoryTemplate(): string {
  const names = INVENTORY_COLUMNS.map((c) => c.name);
  const single: Record<string, string> = Object.fromEntries(INVENTORY_COLUMNS.filter((c) => c.name !== 'instances').map((c) => [c.name, c.example]));
  const replicas: Record<string, string> = {
    service: 'search',
    sketch: 'heavy-queries',
    team: 'discovery',
    instances: example('instances').replace(/checkout/g, 'search').replace('9501', '9511').replace('9502', '9512'),
    errorBudget: '200',
    confidence: '0.995',
  };
  return [names, names.map((n) => single[n] ?? ''), names.map((n) => replicas[n] ?? '')].map((row) => csvRecord(row)).join('');
}
