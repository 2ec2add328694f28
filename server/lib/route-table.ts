import type { Request, RequestHandler, Response, Router } from 'express';
import type { Role } from '../schemas/common';
import { AppError, unauthenticated } from './errors';
import type { Viewer } from './viewer';

export type HttpMethod = 'get' | 'post' | 'put' | 'patch' | 'delete';
/** Who may call a route: anyone, or signed-in people holding one of the roles. */
export type Access = 'public' | readonly Role[];

export interface RouteEntry {
  method: HttpMethod;
  path: string;
  access: Access;
}

type Handler = (req: Request, res: Response) => Promise<unknown> | unknown;

/**
 * Every API route is declared here with its access rule, so the role check cannot be
 * forgotten and the role x route matrix test can list every route there is.
 */
export class RouteTable {
  readonly entries: RouteEntry[] = [];

  constructor(
    private readonly router: Router,
    private readonly prefix = '/api',
  ) {}

  add(
    method: HttpMethod,
    path: string,
    access: Access,
    handler: Handler,
    ...before: RequestHandler[]
  ) {
    this.entries.push({ method, path: this.prefix + path, access });
    this.router[method](path, ...before, async (req: Request, res: Response) => {
      checkAccess(req.viewer, access);
      await handler(req, res);
    });
  }
}

function checkAccess(viewer: Viewer | undefined, access: Access): void {
  if (access === 'public') return;
  if (!viewer) throw unauthenticated();
  if (!access.includes(viewer.role)) {
    throw new AppError('forbidden', 403, 'Your role does not allow this.');
  }
}

/** The signed-in viewer of a route whose access rule already guaranteed one. */
export function viewerOf(req: Request): Viewer {
  if (!req.viewer) throw unauthenticated();
  return req.viewer;
}
