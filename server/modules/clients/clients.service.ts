import type { Db } from '../../db/database';
import { recordAudit } from '../../lib/audit';
import { AppError, notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import type { Client, CreateClientRequest } from '../../schemas/clients';
import * as repo from './clients.repository';

export type ClientsService = ReturnType<typeof createClientsService>;

export function slugify(name: string): string {
  return (
    name
      .normalize('NFKD')
      .replace(/[\u0300-\u036f]/g, '')
      .toLowerCase()
      // Letters that do not decompose into a base letter and an accent.
      .replace(/[øœ]/g, 'o')
      .replace(/æ/g, 'ae')
      .replace(/ß/g, 'ss')
      .replace(/[łđ]/g, (letter) => (letter === 'ł' ? 'l' : 'd'))
      .replace(/&/g, ' and ')
      .replace(/[^a-z0-9]+/g, '-')
      .replace(/^-+|-+$/g, '')
      .slice(0, 60) || 'client'
  );
}

/** Which client a viewer may see: all for studio staff, their own for coordinators. */
function visibleClientId(viewer: Viewer): string | null {
  return viewer.role === 'coordinator' ? viewer.clientId : null;
}

export function createClientsService(deps: { db: Db }) {
  const { db } = deps;
  return {
    list: (viewer: Viewer) => repo.listClients(db, visibleClientId(viewer)),

    async get(viewer: Viewer, id: string): Promise<Client> {
      // A coordinator asking for another client's id learns nothing: same 404 as a missing one.
      if (viewer.role === 'coordinator' && viewer.clientId !== id) throw notFound('That client');
      const [client] = await repo.listClients(db, id);
      if (!client) throw notFound('That client');
      return client;
    },

    async create(actor: Viewer, input: CreateClientRequest): Promise<Client> {
      if (await repo.nameExists(db, input.name)) {
        throw new AppError('client_exists', 409, 'A client with that name already exists.', {
          fieldErrors: { name: ['A client with that name already exists.'] },
        });
      }
      const base = slugify(input.name);
      let slug = base;
      for (let n = 2; await repo.slugExists(db, slug); n += 1) slug = `${base}-${n}`;
      const id = await repo.insertClient(db, { name: input.name, slug });
      await recordAudit(db, {
        actorUserId: actor.id,
        action: 'client.created',
        subjectType: 'client',
        subjectId: id,
      });
      const [client] = await repo.listClients(db, id);
      if (!client) throw notFound('That client');
      return client;
    },
  };
}
