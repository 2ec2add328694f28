import type { Request, RequestHandler } from 'express';
import { AppError } from './errors';

/**
 * A state-changing request from another site is refused. Browsers send Sec-Fetch-Site and
 * Origin on such requests; a request without either did not come from a page at all (a script,
 * a test), which a cross-site attack cannot produce. `same-site` is refused too: a sibling
 * subdomain is another site for our purposes.
 */
export function assertSameSite(req: Request): void {
  const site = req.get('sec-fetch-site');
  if (site && site !== 'same-origin' && site !== 'none') throw crossSite();
  const origin = req.get('origin');
  // req.host follows X-Forwarded-Host only when TRUST_PROXY says the proxy is believed.
  if (origin && origin !== `${req.protocol}://${req.host}`) throw crossSite();
}

/**
 * Every state-changing API request is checked, with a body or without one: a bodiless
 * `text/plain` POST needs no preflight, so the JSON-only rule alone does not cover it.
 */
export const refuseCrossSiteChanges: RequestHandler = (req, _res, next) => {
  if (['GET', 'HEAD', 'OPTIONS'].includes(req.method)) {
    next();
    return;
  }
  assertSameSite(req);
  next();
};

const crossSite = () =>
  new AppError('cross_site', 403, 'This change must come from a Likeness page on this site.');
