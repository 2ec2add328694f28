import type { Request } from 'express';
import { AppError } from './errors';

/**
 * A state-changing request from another site is refused. Browsers send Sec-Fetch-Site and
 * Origin on such requests; a request without either did not come from a page at all (a script,
 * a test), which a cross-site attack cannot produce.
 */
export function assertSameSite(req: Request): void {
  const site = req.get('sec-fetch-site');
  if (site && site !== 'same-origin' && site !== 'none') throw crossSite();
  const origin = req.get('origin');
  if (origin && origin !== `${req.protocol}://${req.get('host') ?? ''}`) throw crossSite();
}

const crossSite = () =>
  new AppError('cross_site', 403, 'This change must come from a Likeness page on this site.');
