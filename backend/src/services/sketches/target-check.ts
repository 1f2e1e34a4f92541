import type { Config } from '../../config';
import { AppError } from '../../http/errors';
import { checkTarget, parseAllowlist, type Allowlist, type Resolver } from '../../../../collectors/target-safety';

/** What the web server needs to vet and test target addresses: the same rules the collectors scrape by. */
export interface TargetPolicy {
  allowlist: Allowlist;
  maxBytes: number;
  resolve?: Resolver;
}

export function targetPolicyOf(config: Config, resolve?: Resolver): TargetPolicy {
  return { allowlist: parseAllowlist(config.TARGET_ALLOWLIST), maxBytes: config.SCRAPE_MAX_BYTES, resolve };
}

/**
 * Refuses a registration or change whose addresses the collectors would refuse
 * to scrape, naming the field: `targetUrl`, or `instances.N.targetUrl`.
 */
export async function checkTargetUrls(urls: string[], listed: boolean, policy: TargetPolicy): Promise<void> {
  for (const [index, url] of urls.entries()) {
    const check = await checkTarget(url, policy.allowlist, policy.resolve);
    if (!check.ok) {
      const field = listed ? `instances.${index}.targetUrl` : 'targetUrl';
      throw new AppError(400, check.kind === 'not allowed' ? 'target_not_allowed' : 'target_host_not_found', `${field} is ${check.reason}.`, field);
    }
  }
}
