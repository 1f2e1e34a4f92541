import dns from 'node:dns';
import type { LookupFunction } from 'node:net';
import { addressAllowed, hostAllowed, neverScraped, normaliseAddress, parseAllowlist, type Allowlist } from './address-rules';

export { parseAllowlist, type Allowlist } from './address-rules';

export interface CheckedAddress {
  address: string;
  family: 4 | 6;
}

export type Resolver = (host: string) => Promise<CheckedAddress[]>;

export type TargetCheck =
  | { ok: true; url: URL; host: string; addresses: CheckedAddress[] }
  | { ok: false; kind: 'not allowed' | 'host not found'; reason: string };

const systemResolver: Resolver = async (host) => {
  const found = await dns.promises.lookup(host, { all: true, verbatim: true });
  return found.map((a) => ({ address: a.address, family: a.family === 6 ? 6 : 4 }));
};

const refuse = (reason: string): TargetCheck => ({ ok: false, kind: 'not allowed', reason: `not allowed: ${reason}` });

const parsedLists = new Map<string, Allowlist>();
function listOf(allowlist: Allowlist | string): Allowlist {
  if (typeof allowlist !== 'string') return allowlist;
  let list = parsedLists.get(allowlist);
  if (!list) parsedLists.set(allowlist, (list = parseAllowlist(allowlist)));
  return list;
}

/**
 * Decides whether Brimwatch may fetch this URL: http or https only, and every
 * address the host resolves to inside TARGET_ALLOWLIST (by network, or by the
 * host's name) and outside the addresses never scraped. Run at registration
 * and again before every scrape; the scrape then connects only to the
 * addresses checked here (see `pinnedLookup`), so a name that resolves
 * differently a moment later cannot lead it elsewhere.
 */
export async function checkTarget(rawUrl: string, allowlist: Allowlist | string, resolve: Resolver = systemResolver): Promise<TargetCheck> {
  let url: URL;
  try {
    url = new URL(rawUrl);
  } catch {
    return refuse(`${JSON.stringify(String(rawUrl).slice(0, 200))} is not a full URL such as http://10.0.0.5:9100/metrics`);
  }
  if (url.protocol !== 'http:' && url.protocol !== 'https:') return refuse(`only http and https targets are scraped (got ${url.protocol})`);
  if (url.username || url.password) return refuse('the target URL carries a user name or password; Brimwatch does not store credentials in target URLs');
  const list = listOf(allowlist);
  // The URL parser has already turned decimal, octal and hex IPv4 spellings into dotted form.
  const host = url.hostname.startsWith('[') ? url.hostname.slice(1, -1) : url.hostname;
  const literal = normaliseAddress(host);

  let addresses: CheckedAddress[];
  if (literal) {
    addresses = [{ address: literal.toString(), family: literal.kind() === 'ipv4' ? 4 : 6 }];
  } else {
    try {
      addresses = await resolve(host);
    } catch (err) {
      const code = (err as NodeJS.ErrnoException).code ?? (err instanceof Error ? err.message : String(err));
      return { ok: false, kind: 'host not found', reason: `host not found: ${host} does not resolve (${code})` };
    }
    if (addresses.length === 0) return { ok: false, kind: 'host not found', reason: `host not found: ${host} has no address` };
  }

  const byName = !literal && hostAllowed(list, host);
  const checked: CheckedAddress[] = [];
  for (const { address: text } of addresses) {
    const address = normaliseAddress(text);
    if (!address) return refuse(`host ${host} resolved to ${JSON.stringify(text)}, which is not an address`);
    const shown = literal ? address.toString() : `${address.toString()} (of host ${host})`;
    const never = neverScraped(address);
    if (never) return refuse(`address ${shown} is ${never}; such addresses are never scraped`);
    if (!byName && !addressAllowed(list, address)) {
      return refuse(`address ${shown} is outside TARGET_ALLOWLIST (${list.text}); ask an admin to add its network or host name`);
    }
    checked.push({ address: address.toString(), family: address.kind() === 'ipv4' ? 4 : 6 });
  }
  return { ok: true, url, host, addresses: checked };
}

/** A `lookup` for node:http(s) that answers only with the addresses already checked. */
export function pinnedLookup(addresses: CheckedAddress[]): LookupFunction {
  return ((_host: string, options: dns.LookupOptions, callback: (...args: unknown[]) => void) => {
    const wanted = options?.family === 4 || options?.family === 6 ? addresses.filter((a) => a.family === options.family) : addresses;
    if (wanted.length === 0) {
      callback(Object.assign(new Error('no checked address of the requested family'), { code: 'ENOTFOUND' }));
      return;
    }
    if (options?.all) callback(null, wanted);
    else callback(null, wanted[0].address, wanted[0].family);
  }) as LookupFunction;
}
