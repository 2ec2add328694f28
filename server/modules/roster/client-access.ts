import type { Db } from '../../db/database';
import { notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import { clientExists } from './roster.repository';

/**
 * A coordinator acts on their own client only; asking about another client's roster answers
 * 404 exactly like a missing client. The studio admin acts on any client's behalf.
 */
export async function assertClientAccess(db: Db, viewer: Viewer, clientId: string) {
  if (viewer.role === 'coordinator' && viewer.clientId !== clientId) throw notFound('That client');
  if (viewer.role !== 'coordinator' && viewer.role !== 'studio_admin') {
    throw notFound('That client');
  }
  if (!(await clientExists(db, clientId))) throw notFound('That client');
}
