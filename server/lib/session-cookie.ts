import type { CookieOptions, Request, RequestHandler, Response } from 'express';
import type { Viewer } from './viewer';

export const SESSION_COOKIE = 'likeness_session';

function cookieOptions(req: Request, expires?: Date): CookieOptions {
  return {
    httpOnly: true,
    sameSite: 'lax',
    // req.secure follows X-Forwarded-Proto only when TRUST_PROXY is set.
    secure: req.secure,
    path: '/',
    ...(expires ? { expires } : {}),
  };
}

export function setSessionCookie(req: Request, res: Response, token: string, expires: Date) {
  res.cookie(SESSION_COOKIE, token, cookieOptions(req, expires));
}

export function clearSessionCookie(req: Request, res: Response) {
  res.clearCookie(SESSION_COOKIE, cookieOptions(req));
}

/** Resolves the session cookie into req.viewer; an unknown cookie is simply dropped. */
export function loadViewer(resolve: (token: string) => Promise<Viewer | null>): RequestHandler {
  return async (req, res, next) => {
    const token: unknown = req.cookies?.[SESSION_COOKIE];
    if (typeof token === 'string' && token.length > 0 && token.length < 200) {
      const viewer = await resolve(token);
      if (viewer) req.viewer = viewer;
      else clearSessionCookie(req, res);
    }
    next();
  };
}

export function requestMeta(req: Request) {
  return { ipAddress: req.ip ?? null, userAgent: req.get('user-agent') ?? null };
}
