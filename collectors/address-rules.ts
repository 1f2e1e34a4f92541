import ipaddr from 'ipaddr.js';

export type Address = ipaddr.IPv4 | ipaddr.IPv6;

/**
 * Addresses never scraped, whatever TARGET_ALLOWLIST says: cloud metadata
 * services hand out credentials to whoever asks from inside, and link-local,
 * unspecified, multicast and reserved addresses are never a service's
 * metrics endpoint.
 */
const NEVER: readonly [string, string][] = [
  ['0.0.0.0/8', 'an unspecified ("this network") address'],
  ['169.254.0.0/16', 'a link-local address (cloud metadata lives here)'],
  ['100.100.100.200/32', 'a cloud metadata address'],
  ['168.63.129.16/32', 'a cloud platform address'],
  ['224.0.0.0/4', 'a multicast address'],
  ['240.0.0.0/4', 'a reserved or broadcast address'],
  ['::/128', 'an unspecified address'],
  ['fe80::/10', 'a link-local address'],
  ['fd00:ec2::254/128', 'a cloud metadata address'],
  ['ff00::/8', 'a multicast address'],
];
const NEVER_RANGES = NEVER.map(([cidr, why]) => ({ range: ipaddr.parseCIDR(cidr), why }));

/**
 * Reads an address in any spelling the resolver or a URL may carry (decimal
 * 2130706433, octal 0177.0.0.1, IPv4-mapped ::ffff:127.0.0.1) and returns it
 * in its plain form, so one check covers every disguise. Undefined when it is
 * not an address.
 */
export function normaliseAddress(text: string): Address | undefined {
  const bare = text.startsWith('[') && text.endsWith(']') ? text.slice(1, -1) : text;
  try {
    return ipaddr.process(bare.replace(/%.*$/, ''));
  } catch {
    return undefined;
  }
}

/** IPv6 forms that carry an IPv4 address inside (NAT64, SIIT, 6to4, IPv4-compatible) reach that IPv4 host. */
function embeddedIPv4(address: Address): ipaddr.IPv4 | undefined {
  if (address.kind() !== 'ipv6') return undefined;
  const bytes = (address as ipaddr.IPv6).toByteArray();
  const range = address.range();
  if (range === '6to4') return new ipaddr.IPv4(bytes.slice(2, 6));
  const ipv4Compatible = bytes.slice(0, 12).every((b) => b === 0) && range !== 'loopback' && range !== 'unspecified';
  if (range === 'rfc6052' || range === 'rfc6145' || ipv4Compatible) return new ipaddr.IPv4(bytes.slice(12, 16));
  return undefined;
}

/** Why this address is never scraped, or undefined when only the allowlist decides. */
export function neverScraped(address: Address): string | undefined {
  for (const candidate of [address, embeddedIPv4(address)]) {
    if (!candidate) continue;
    const hit = NEVER_RANGES.find(({ range }) => candidate.kind() === range[0].kind() && candidate.match(range));
    if (hit) return hit.why;
  }
  return undefined;
}

export interface Allowlist {
  networks: [Address, number][];
  /** Lower-case host names; an entry "*.example.test" allows every name under example.test. */
  hosts: string[];
  text: string;
}

const HOST_NAME = /^(\*\.)?[a-z0-9]([a-z0-9-]*[a-z0-9])?(\.[a-z0-9]([a-z0-9-]*[a-z0-9])?)*$/;

/** Reads TARGET_ALLOWLIST; a bad entry stops with the entry named and the fix. */
export function parseAllowlist(text: string): Allowlist {
  const list: Allowlist = { networks: [], hosts: [], text };
  for (const raw of text.split(',').map((e) => e.trim().toLowerCase()).filter((e) => e !== '')) {
    if (ipaddr.isValidCIDR(raw)) {
      const [network, bits] = ipaddr.parseCIDR(raw);
      list.networks.push([network, bits]);
    } else if (ipaddr.isValid(raw)) {
      const address = ipaddr.parse(raw);
      list.networks.push([address, address.kind() === 'ipv4' ? 32 : 128]);
    } else if (HOST_NAME.test(raw.replace(/\.$/, ''))) {
      list.hosts.push(raw.replace(/\.$/, ''));
    } else {
      throw new Error(
        `TARGET_ALLOWLIST has an entry that is neither a network, an address nor a host name: '${raw}'. ` +
          'Fix: list CIDRs (10.0.0.0/8), addresses or host names (metrics.example.test, *.example.test), separated by commas.',
      );
    }
  }
  return list;
}

export function hostAllowed(list: Allowlist, host: string): boolean {
  const name = host.toLowerCase().replace(/\.$/, '');
  return list.hosts.some((entry) => (entry.startsWith('*.') ? name.endsWith(entry.slice(1)) : name === entry));
}

export function addressAllowed(list: Allowlist, address: Address): boolean {
  return list.networks.some(([network, bits]) => network.kind() === address.kind() && address.match(network, bits));
}
