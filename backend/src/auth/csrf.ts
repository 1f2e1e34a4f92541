import type { RequestHandler } from 'express';
import { AppError } from '../http/errors';

const SAFE_METHODS = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * Refuses state-changing requests that a browser sent on behalf of another
 * site. Browsers say where a request comes from in Sec-Fetch-Site; older ones
 * only in Origin. Bearer requests carry no cookie, so no other site can ride on them.
 * Same-site is refused too: on a developer's machine every port of 127.0.0.1 is "same-site".
 */
export function refuseCrossSite(publicUrl: string): RequestHandler {
  const ownOrigin = new URL(publicUrl).origin;
  return (req, _res, next) => {
    if (SAFE_METHODS.has(req.method) || req.get('authorization') !== undefined) return next();
    const site = req.get('sec-fetch-site');
    if (site !== undefined) {
      if (site === 'same-origin' || site === 'none') return next();
      return next(refusal(`Sec-Fetch-Site is ${site}`));
    }
    const origin = req.get('origin');
    if (origin !== undefined && origin !== ownOrigin) return next(refusal(`it came from ${origin}, not ${ownOrigin}`));
    next();
  };
}

function refusal(why: string): AppError {
  return new AppError(403, 'cross_site', `Brimwatch refused a change requested from another site (${why}); make the change from Brimwatch's own pages, or use an API token.`);
}
