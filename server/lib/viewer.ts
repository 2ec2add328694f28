import type { Role } from '../schemas/common';

/** Who is asking: resolved from the session cookie on every request. */
export interface Viewer {
  kind: 'staff' | 'sitter';
  id: string;
  role: Role;
  email: string;
  displayName: string;
  /** The client a coordinator or sitter belongs to; null for studio staff. */
  clientId: string | null;
  sessionId: string;
  sessionExpiresAt: Date;
}

declare global {
  // Express's own extension point for request properties.
  // eslint-disable-next-line @typescript-eslint/no-namespace
  namespace Express {
    interface Request {
      viewer?: Viewer;
      requestId: string;
    }
  }
}
