import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { PassThrough, type Writable } from 'node:stream';
import type { Clock } from '../../adapters/clock';
import type { ObjectStorage } from '../../adapters/storage/storage';
import type { Db } from '../../db/database';
import { addJob, addJobs, type JobHandlers } from '../../jobs/job-queue';
import { recordAudit } from '../../lib/audit';
import { AppError, forbidden, notFound } from '../../lib/errors';
import type { Viewer } from '../../lib/viewer';
import { findDay, lockDay, type DayRecord } from '../days/days.repository';
import { findFollowedDay, findStudioDay } from '../days/studio-day-access';
import * as mailings from '../invitations/invitations.repository';
import { findLook } from '../looks/looks.repository';
import { lookSchema } from '../../schemas/looks';
import { manifestCsv, missingListCsv } from './delivery-csv';
import * as repo from './delivery.repository';
import { uniqueFileNames } from './file-names';
import { streamZip } from './set-zip';

export const PORTRAITS_MAIL_TASK = 'portraits-mail';
const LINK_TTL_MS = 30 * 24 * 3_600_000;
const archiveKey = (dayId: string, release: number) => `archives/${dayId}/release-${release}.zip`;
export const STORE_ARCHIVE_TASK = 'store-set-archive';
/** Tells the client's coordinators a release is ready (once per release). */
export const SET_RELEASED_HR_MAIL_TASK = 'set-released-hr-mail';
export const hashToken = (token: string) => createHash('sha256').update(token).digest('hex');

export type DeliveryService = ReturnType<typeof createDeliveryService>;

/** A personal link for a sitter's own renditions: random, stored hashed, 30 days, revocable. */
export async function issueDownloadLink(db: Db, clock: Clock, dayId: string, personId: string) {
  const token = randomBytes(32).toString('base64url');
  await db
    .insertInto('sitterDownloadLinks')
    .values({
      id: randomUUID(),
      dayId,
      personId,
      tokenHash: hashToken(token),
      expiresAt: new Date(clock.now().getTime() + LINK_TTL_MS),
    })
    .execute();
  return token;
}

/** The finished set: released by the studio, downloaded by HR, each sitter's own link. */
export function createDeliveryService(deps: { db: Db; clock: Clock; storage: ObjectStorage }) {
  const { db, clock, storage } = deps;

  const readableDay = (viewer: Viewer, dayId: string) => findFollowedDay(db, viewer, dayId);

  /**
   * Whether the set can be released now, and if not why: the one rule of the release and of
   * the status that offers it. A release is the whole set as it is now: never an older file in
   * place of a new final.
   */
  async function releaseReadiness(day: DayRecord) {
    const look = await findLook(db, day.clientId);
    if (!look) {
      return {
        ok: false as const,
        blocker: new AppError('no_look', 409, 'Set up the client’s look first.'),
      };
    }
    const renditionNames = lookSchema
      .parse({ name: look.name, renditions: look.renditions })
      .renditions.map((rendition) => rendition.name);
    const waiting = await repo.sittersNotRendered(db, day.id, look.version, renditionNames);
    if (waiting.length > 0) {
      const shown = waiting.slice(0, 5).join(', ');
      const more = waiting.length > 5 ? ` and ${waiting.length - 5} more` : '';
      return {
        ok: false as const,
        blocker: new AppError(
          'set_not_rendered',
          409,
          `Not every portrait is rendered in the current look from its latest file: ${shown}${more}. Press "Find eyes and render the set" (and mark any eyes it asks for), then release.`,
        ),
      };
    }
    const rendered = await repo.renderedSet(db, day.id, look.version);
    if (rendered.length === 0) {
      return {
        ok: false as const,
        blocker: new AppError(
          'nothing_rendered',
          409,
          'No portrait has been rendered in the current look yet.',
        ),
      };
    }
    return { ok: true as const, look, rendered };
  }

  return {
    readableDay,

    /** Makes the day's current set from its rendered renditions; says what changed. */
    async release(viewer: Viewer, dayId: string) {
      const day = await findStudioDay(db, viewer, dayId);
      const ready = await releaseReadiness(day);
      if (!ready.ok) throw ready.blocker;
      const { look, rendered } = ready;
      const names = uniqueFileNames(
        look.fileNameTemplate,
        rendered.map((row) => ({
          parts: {
            employee_id: row.employeeId,
            given: row.givenName,
            family: row.familyName,
            preferred: row.preferredName,
            office: row.officeName,
            department: row.department,
            rendition: row.renditionName,
            day: day.date,
          },
          extension: 'jpg',
        })),
      );
      const summary = {
        files: rendered.length,
        people: new Set(rendered.map((row) => row.personId)).size,
      };
      // Under the day's lock, the set now is compared with the last release as it stands, so
      // two releases at once (a double click) make one, and a release with nothing new (a
      // second click later) makes none: that release stands.
      return db.transaction().execute(async (trx) => {
        await lockDay(trx, day.id);
        const previous = await repo.latestRelease(trx, day.id);
        const before = new Map(
          (await repo.currentSet(trx, day.id)).map((row) => [
            `${row.pickId}:${row.renditionName}`,
            { sha256: row.sha256, fileName: row.fileName },
          ]),
        );
        const rows = rendered.map((row, index) => {
          const was = before.get(`${row.pickId}:${row.renditionName}`);
          return {
            id: randomUUID(),
            personId: row.personId,
            pickId: row.pickId,
            renditionName: row.renditionName,
            fileName: names[index]!,
            key: row.key!,
            byteSize: row.byteSize ?? '0',
            sha256: row.sha256!,
            // A new file, or the same one under a new name (HR's systems go by the name).
            changed: was?.sha256 !== row.sha256 || was?.fileName !== names[index],
          };
        });
        const changed = rows.filter((row) => row.changed).length;
        if (previous && changed === 0 && rows.length === before.size) {
          return { release: previous.release, changed: 0, unchanged: true, ...summary };
        }
        const release = (previous?.release ?? 0) + 1;
        const people = [...new Set(rows.filter((row) => row.changed).map((row) => row.personId))];
        await repo.replaceSet(
          trx,
          { id: randomUUID(), dayId: day.id, release, userId: viewer.id, changed },
          rows,
        );
        await addJob(
          trx,
          STORE_ARCHIVE_TASK,
          { dayId: day.id, release },
          { jobKey: `store-set-archive:${day.id}` },
        );
        await addJob(
          trx,
          SET_RELEASED_HR_MAIL_TASK,
          { dayId: day.id, release },
          { jobKey: `set-released-hr:${day.id}:${release}` },
        );
        const ids = await mailings.insertMailings(trx, day.id, people, 'portraits_ready', release);
        await addJobs(
          trx,
          PORTRAITS_MAIL_TASK,
          ids.map((mailingId) => ({
            payload: { mailingId },
            jobKey: `portraits-mail:${mailingId}`,
          })),
        );
        await recordAudit(trx, {
          actorUserId: viewer.id,
          action: 'delivery.released',
          subjectType: 'shoot_day',
          subjectId: day.id,
          details: { release, files: rows.length, changed },
        });
        return { release, changed, unchanged: false, ...summary };
      });
    },

    async status(viewer: Viewer, dayId: string) {
      const day = await readableDay(viewer, dayId);
      const [latest, set, ready] = await Promise.all([
        repo.latestRelease(db, day.id),
        repo.currentSet(db, day.id),
        releaseReadiness(day),
      ]);
      const offices = [
        ...new Set(set.map((row) => row.officeName).filter((name): name is string => !!name)),
      ].sort();
      const departments = [
        ...new Set(set.map((row) => row.department).filter((name): name is string => !!name)),
      ].sort();
      return {
        release: latest?.release ?? null,
        releasedAt: latest?.releasedAt.toISOString() ?? null,
        files: set.length,
        changed: set.filter((row) => row.changed).length,
        people: new Set(set.map((row) => row.personId)).size,
        offices,
        departments,
        // What stops a release now, said before anyone presses it.
        releaseBlocker: ready.ok ? null : ready.blocker.message,
      };
    },

    /**
     * Streams the set (or one office's or department's part) as a ZIP while it is written:
     * manifest.csv, missing.csv, then each file, one at a time (memory stays flat; ZIP64 is
     * automatic past 4 GB).
     */
    async writeZip(
      viewer: Viewer,
      dayId: string,
      filter: { office?: string | undefined; department?: string | undefined },
      out: Writable,
    ) {
      const day = await readableDay(viewer, dayId);
      if (viewer.role === 'photographer')
        throw forbidden('HR and the studio admin download the set.');
      await buildZip(day, filter, out);
    },

    /** The whole set's stored archive for the current release, when it has been written. */
    async storedArchive(viewer: Viewer, dayId: string) {
      const day = await readableDay(viewer, dayId);
      if (viewer.role === 'photographer')
        throw forbidden('HR and the studio admin download the set.');
      const latest = await repo.latestRelease(db, day.id);
      if (!latest) return null;
      const key = archiveKey(day.id, latest.release);
      const stat = await storage.stat(key);
      return stat ? { key, size: stat.size, release: latest.release } : null;
    },

    readArchive: (key: string, range?: { start: number; end: number }) => storage.read(key, range),

    /** Job: writes the whole set of a release to storage, so a broken download can resume. */
    async storeArchive(dayId: string, release: number) {
      const latest = await repo.latestRelease(db, dayId);
      const day = await findDay(db, dayId);
      if (!day || latest?.release !== release) return; // a newer release has its own job
      const stream = new PassThrough();
      const stored = storage.put(archiveKey(dayId, release), stream, {
        contentType: 'application/zip',
      });
      await buildZip(day, {}, stream);
      await stored;
    },

    issueLink: (dayId: string, personId: string) => issueDownloadLink(db, clock, dayId, personId),

    async revokeLinks(viewer: Viewer, dayId: string, personId: string) {
      const day = await findStudioDay(db, viewer, dayId);
      const result = await db
        .updateTable('sitterDownloadLinks')
        .set({ revokedAt: clock.now() })
        .where('dayId', '=', day.id)
        .where('personId', '=', personId)
        .where('revokedAt', 'is', null)
        .executeTakeFirst();
      return { revoked: Number(result.numUpdatedRows) };
    },

    /** The files behind a sitter's link, or a plain refusal when it is unknown, expired or revoked. */
    async filesForLink(token: string) {
      const link = await db
        .selectFrom('sitterDownloadLinks')
        .where('tokenHash', '=', hashToken(token))
        .selectAll()
        .executeTakeFirst();
      if (!link || link.revokedAt || link.expiresAt.getTime() < clock.now().getTime()) {
        throw new AppError(
          'link_expired',
          410,
          'This download link has expired or was withdrawn: ask the studio for a new one.',
        );
      }
      return filesOf(link.dayId, link.personId);
    },

    filesOf,

    handlers(): JobHandlers {
      return {
        [STORE_ARCHIVE_TASK]: async (payload) => {
          const job = payload as { dayId?: unknown; release?: unknown };
          if (typeof job.dayId === 'string' && typeof job.release === 'number') {
            await this.storeArchive(job.dayId, job.release);
          }
        },
      };
    },

    async openDelivered(id: string, personId: string) {
      const row = await db
        .selectFrom('deliveredRenditions')
        .where('id', '=', id)
        .where('personId', '=', personId)
        .select(['key', 'fileName', 'byteSize'])
        .executeTakeFirst();
      if (!row) throw notFound('That portrait');
      return {
        stream: await storage.read(row.key),
        fileName: row.fileName,
        size: Number(row.byteSize),
      };
    },
  };

  async function buildZip(
    day: DayRecord,
    filter: { office?: string | undefined; department?: string | undefined },
    out: Writable,
  ) {
    const set = (await repo.currentSet(db, day.id)).filter(
      (row) =>
        (!filter.office || row.officeName === filter.office) &&
        (!filter.department || row.department === filter.department),
    );
    if (set.length === 0)
      throw new AppError('nothing_released', 409, 'No portraits have been released for that yet.');
    const expected = await repo.expectedPeople(db, day);
    const delivered = new Set(set.map((row) => row.personId));
    const missingPeople = await repo.peopleByIds(
      db,
      expected.invitedIds.filter((id) => !delivered.has(id)),
    );
    const missing = missingPeople.filter(
      (person) =>
        (!filter.office || person.officeName === filter.office) &&
        (!filter.department || person.department === filter.department),
    );
    const manifest = manifestCsv(set);
    const picksInSet = new Set(set.map((row) => row.pickId));
    const partlyIds = [...delivered].filter((personId) =>
      (expected.picksOf.get(personId) ?? []).some((pickId) => !picksInSet.has(pickId)),
    );
    const partly = (await repo.peopleByIds(db, partlyIds)).map((person) => {
      const chosen = expected.picksOf.get(person.id) ?? [];
      return {
        person,
        chosen: chosen.length,
        waiting: chosen.filter((pickId) => !picksInSet.has(pickId)).length,
      };
    });
    const missingCsv = missingListCsv(missing, expected, partly);
    await streamZip(
      out,
      [
        { name: 'manifest.csv', content: manifest },
        { name: 'missing.csv', content: missingCsv },
      ],
      set.map((row) => ({ name: row.fileName, open: () => storage.read(row.key) })),
    );
  }

  async function filesOf(dayId: string, personId: string) {
    const rows = await db
      .selectFrom('deliveredRenditions')
      .where('dayId', '=', dayId)
      .where('personId', '=', personId)
      .select(['id', 'fileName', 'renditionName', 'byteSize'])
      .orderBy('renditionName')
      .execute();
    return {
      dayId,
      personId,
      files: rows.map((row) => ({ ...row, byteSize: Number(row.byteSize) })),
    };
  }
}
