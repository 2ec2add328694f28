import type { Db } from '../../db/database';
import { recordAudit } from '../../lib/audit';
import { AppError, forbidden, notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import { lookSchema, type Look } from '../../schemas/looks';
import { findStudioDay } from '../days/studio-day-access';
import { fileStem, unknownTokens } from '../delivery/file-names';
import { lookPresets } from './look-presets';
import { findLook, saveLook } from './looks.repository';
import * as portraits from './portraits.repository';

export type LooksService = ReturnType<typeof createLooksService>;

const defaultTemplate = '{employee_id}_{family}_{given}_{rendition}';

/** A client's look (studio admin edits it, the client's coordinator may view it) and a day's set. */
export function createLooksService(deps: { db: Db }) {
  const { db } = deps;

  function mayView(viewer: Viewer, clientId: string) {
    if (viewer.role === 'coordinator' && viewer.clientId !== clientId)
      throw notFound('That client');
    if (viewer.role === 'sitter') throw forbidden('Looks are the studio’s.');
  }

  async function clientExists(clientId: string) {
    const client = await db
      .selectFrom('clients')
      .where('id', '=', clientId)
      .select(['id', 'name'])
      .executeTakeFirst();
    if (!client) throw notFound('That client');
    return client;
  }

  return {
    async look(viewer: Viewer, clientId: string) {
      mayView(viewer, clientId);
      await clientExists(clientId);
      const look = await findLook(db, clientId);
      return {
        look: look ? lookSchema.parse({ name: look.name, renditions: look.renditions }) : null,
        fileNameTemplate: look?.fileNameTemplate ?? defaultTemplate,
        version: look?.version ?? 0,
        presets: lookPresets.map((preset) => ({
          key: preset.key,
          rendition: preset.rendition,
          sources: preset.sources,
        })),
      };
    },

    async saveLook(viewer: Viewer, clientId: string, input: Look & { fileNameTemplate: string }) {
      await clientExists(clientId);
      const unknown = unknownTokens(input.fileNameTemplate);
      if (unknown.length > 0) {
        throw new AppError(
          'invalid_input',
          400,
          `The file-name template has unknown parts: ${unknown.map((token) => `{${token}}`).join(', ')}.`,
          {
            fieldErrors: { fileNameTemplate: ['Use only the listed parts.'] },
          },
        );
      }
      const saved = await saveLook(db, clientId, input, viewer.id);
      await recordAudit(db, {
        actorUserId: viewer.id,
        action: 'looks.saved',
        subjectType: 'client',
        subjectId: clientId,
        details: { version: saved.version, renditions: input.renditions.length },
      });
      return { version: saved.version };
    },

    /** The template filled in for real people of the client, before it is saved. */
    async previewNames(viewer: Viewer, clientId: string, template: string, rendition: string) {
      mayView(viewer, clientId);
      const unknown = unknownTokens(template);
      const people = await db
        .selectFrom('people')
        .leftJoin('offices', 'offices.id', 'people.officeId')
        .where('people.clientId', '=', clientId)
        .where('people.active', '=', true)
        .select([
          'people.employeeId',
          'people.givenName',
          'people.familyName',
          'people.preferredName',
          'people.department',
          'offices.name as officeName',
        ])
        .orderBy('people.familyName')
        .limit(5)
        .execute();
      return {
        unknownTokens: unknown,
        examples: people.map((person) => ({
          name: `${person.givenName} ${person.familyName}`,
          fileName: `${fileStem(template, {
            employee_id: person.employeeId,
            given: person.givenName,
            family: person.familyName,
            preferred: person.preferredName,
            office: person.officeName,
            department: person.department,
            rendition,
            day: null,
          })}.jpg`,
        })),
      };
    },

    /** Every pick of the day with its eyes and renditions, for the review grid. */
    async daySet(viewer: Viewer, dayId: string) {
      const day = await findStudioDay(db, viewer, dayId);
      const look = await findLook(db, day.clientId);
      const { picks, renditions } = await portraits.daySet(db, day.id);
      const renditionNames = look
        ? lookSchema.parse({ name: look.name, renditions: look.renditions }).renditions
        : [];
      return {
        dayId: day.id,
        clientName: day.clientName,
        dayDate: day.date,
        lookVersion: look?.version ?? null,
        renditions: renditionNames.map((rendition) => ({
          name: rendition.name,
          width: rendition.width,
          height: rendition.height,
          eyeLine: rendition.eyeLine,
        })),
        sitters: picks.map((pick) => {
          const eyesCurrent = pick.eyesSourceKey === pick.sourceKey;
          const mine = renditions.filter((row) => row.pickId === pick.pickId);
          return {
            pickId: pick.pickId,
            personId: pick.personId,
            name: pick.name,
            employeeId: pick.employeeId,
            fileName: pick.cardPath.split('/').pop() ?? pick.cardPath,
            hasFinal: pick.hasFinal,
            eyes:
              eyesCurrent && pick.eyeStatus
                ? {
                    status: pick.eyeStatus,
                    left:
                      pick.leftX === null || pick.leftY === null
                        ? null
                        : { x: pick.leftX, y: pick.leftY },
                    right:
                      pick.rightX === null || pick.rightY === null
                        ? null
                        : { x: pick.rightX, y: pick.rightY },
                    imageWidth: pick.imageWidth,
                    imageHeight: pick.imageHeight,
                  }
                : null,
            needsAHand:
              eyesCurrent &&
              pick.eyeStatus !== null &&
              pick.eyeStatus !== 'found' &&
              pick.eyeStatus !== 'marked',
            renditions: renditionNames.map((rendition) => {
              const row = mine.find((each) => each.renditionName === rendition.name);
              const current =
                row && row.lookVersion === look?.version && row.sourceKey === pick.sourceKey;
              return {
                name: rendition.name,
                status: current ? row.status : 'waiting',
                refusal: current ? row.refusal : null,
              };
            }),
          };
        }),
      };
    },
  };
}
