import { randomUUID } from 'node:crypto';
import { replacePicks } from '../../server/modules/proofs/proofs.repository';
import { execFileSync } from 'node:child_process';
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { buffer } from 'node:stream/consumers';
import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { startTestApp, type TestApp } from '../setup/test-app';
import { cameraJpeg, decompressionBomb, pngImage } from '../support/camera-cards';
import { binaryBody, signedInAgent } from './helpers';
import { settlePicksNow, setUpProofsDay } from './proofs-day';
import { createUpload, patchUpload, type TusSession } from './tus-client';
import { insertStaff } from '../factories/accounts';

let t: TestApp;
let ready: Awaited<ReturnType<typeof setUpProofsDay>>;
let studio: request.Agent;
let upload: TusSession;
interface Row {
  pickId: string;
  sitterName: string;
  fileName: string;
  chosenBy: string;
  note: string | null;
  status: string;
  takenByMe: boolean;
  hasFinal: boolean;
}

const queue = async (query = '') =>
  (await studio.get(`/api/days/${ready.day.dayId}/retouch${query}`).expect(200)).body as {
    rows: Row[];
    total: number;
    counts: Record<string, number>;
  };

async function sendFinal(pickId: string, fileName: string, bytes: Buffer) {
  const created = await createUpload(
    upload,
    { purpose: 'final', dayId: ready.day.dayId, pickId, cardPath: fileName },
    bytes.length,
  );
  if (created.status !== 201) return created;
  return patchUpload(upload, created.url!, 0, bytes);
}

beforeAll(async () => {
  t = await startTestApp();
  ready = await setUpProofsDay(t, 3);
  studio = ready.studio;
  upload = ready.session;
  const [first, second] = ready.sitters;
  for (const [index, sitter] of [first!, second!].entries()) {
    const proofs = (await sitter.agent.get(`/api/proofs/${ready.day.dayId}`).expect(200)).body;
    await sitter.agent
      .put(`/api/proofs/${ready.day.dayId}/picks`)
      .send({
        picks: [
          { frameId: proofs.frames[index].id, note: index === 0 ? 'Glare on the glasses' : null },
        ],
      })
      .expect(200);
  }
  // The deadline passes with the third sitter undecided: the first frame after the slate stands.
  await t.db
    .updateTable('dayProofs')
    .set({ picksCloseAt: new Date(t.clock.now().getTime() - 60_000) })
    .where('dayId', '=', ready.day.dayId)
    .execute();
  await settlePicksNow(t, ready.day.dayId);
}, 120_000);

afterAll(async () => {
  await upload?.close();
  await t?.close();
});

describe('the retouch queue', () => {
  it('lists every pick with its note and who chose it, sorted and filtered on the server', async () => {
    const all = await queue();
    expect(all.total).toBe(3);
    expect(all.counts).toEqual({ to_do: 3, in_progress: 0, done: 0 });
    expect(all.rows.map((row) => row.chosenBy).sort()).toEqual(['fallback', 'sitter', 'sitter']);
    expect(all.rows.find((row) => row.note)?.note).toBe('Glare on the glasses');
    const page = await queue('?pageSize=2&page=2&sort=sitter&dir=desc');
    expect(page.rows).toHaveLength(1);
    const byName = await queue(`?q=${encodeURIComponent(all.rows[0]!.sitterName.split(' ')[1]!)}`);
    expect(byName.rows.map((row) => row.pickId)).toEqual([all.rows[0]!.pickId]);
    await studio.get(`/api/days/${ready.day.dayId}/retouch?sort=colour`).expect(400);
    await studio.get(`/api/days/${ready.day.dayId}/retouch?q=%00`).expect(400);
  });

  it('takes a pick, refuses "done" without a final, and audits the change', async () => {
    const [row] = (await queue()).rows;
    const taken = await studio
      .patch(`/api/picks/${row!.pickId}`)
      .send({ status: 'in_progress' })
      .expect(200);
    expect(taken.body).toMatchObject({ retouchStatus: 'in_progress' });
    expect((await queue('?status=in_progress')).rows).toMatchObject([
      { pickId: row!.pickId, takenByMe: true },
    ]);
    const early = await studio
      .patch(`/api/picks/${row!.pickId}`)
      .send({ status: 'done' })
      .expect(409);
    expect(early.body.error.message).toMatch(/Upload the retouched file first/);
    await studio.patch(`/api/picks/${row!.pickId}`).send({}).expect(400);
    const other = await signedInAgent(t, (await insertStaff(t.db, { role: 'photographer' })).email);
    await other.patch(`/api/picks/${row!.pickId}`).send({ status: 'to_do' }).expect(403);
    // The studio admin, on a list loaded before, presses "Take it": told who has it instead.
    const admin = await insertStaff(t.db, { role: 'studio_admin' });
    const adminAgent = await signedInAgent(t, admin.email);
    const stale = await adminAgent
      .patch(`/api/picks/${row!.pickId}`)
      .send({ status: 'in_progress', takenByMe: true })
      .expect(409);
    expect(stale.body.error.code).toBe('pick_taken');
    // Nor can they let it go for its holder.
    const letGo = await adminAgent
      .patch(`/api/picks/${row!.pickId}`)
      .send({ status: 'to_do', takenByMe: false })
      .expect(409);
    expect(letGo.body.error.code).toBe('pick_taken');
    expect((await queue('?status=in_progress')).rows).toMatchObject([
      { pickId: row!.pickId, takenByMe: true },
    ]);
  });

  it('streams every original as one ZIP, one folder per sitter, read back by Info-ZIP unzip', async () => {
    const response = await studio
      .get(`/api/days/${ready.day.dayId}/retouch/originals.zip`)
      .buffer(true)
      .parse(binaryBody)
      .expect(200);
    expect(response.headers['content-type']).toBe('application/zip');
    const folder = mkdtempSync(path.join(os.tmpdir(), 'likeness-zip-'));
    try {
      const file = path.join(folder, 'picks.zip');
      writeFileSync(file, response.body as Buffer);
      // Info-ZIP's unzip is an independent reader: -t tests every entry's CRC-32.
      expect(execFileSync('unzip', ['-t', file], { encoding: 'utf8' })).toMatch(
        /No errors detected/,
      );
      const names = execFileSync('unzip', ['-Z1', file], { encoding: 'utf8' }).trim().split('\n');
      expect(names).toHaveLength(3);
      for (const name of names) expect(name).toMatch(/^[^/]+\/HPE_\d{4}\.JPG$/);
      execFileSync('unzip', ['-q', file, '-d', folder]);
      const original = await t.db
        .selectFrom('picks')
        .innerJoin('frames', 'frames.id', 'picks.frameId')
        .select(['frames.cardPath', 'frames.originalKey'])
        .executeTakeFirstOrThrow();
      const extracted = names.find((name) => name.endsWith(original.cardPath.split('/').pop()!))!;
      const stored = await buffer(await t.storage.read(original.originalKey));
      expect(readFileSync(path.join(folder, extracted)).equals(stored)).toBe(true);
    } finally {
      rmSync(folder, { recursive: true, force: true });
    }
  });

  it('takes a final back through the resumable upload, keeps the original, and marks the pick done', async () => {
    const [row] = (await queue()).rows;
    const pick = await t.db
      .selectFrom('picks')
      .innerJoin('frames', 'frames.id', 'picks.frameId')
      .where('picks.id', '=', row!.pickId)
      .select(['frames.originalKey'])
      .executeTakeFirstOrThrow();
    const before = await buffer(await t.storage.read(pick.originalKey));
    const final = await cameraJpeg({ width: 800, height: 600, shade: 200 });
    const finished = await sendFinal(
      row!.pickId,
      row!.fileName.replace('.JPG', '-retouched.jpg'),
      final,
    );
    expect(finished.status).toBe(204);
    const after = await queue();
    expect(after.rows.find((each) => each.pickId === row!.pickId)).toMatchObject({
      status: 'done',
      hasFinal: true,
    });
    expect((await buffer(await t.storage.read(pick.originalKey))).equals(before)).toBe(true);
    const download = await studio
      .get(`/api/picks/${row!.pickId}/final`)
      .buffer(true)
      .parse(binaryBody)
      .expect(200);
    expect((download.body as Buffer).equals(final)).toBe(true);
    const audit = await t.db
      .selectFrom('auditEvents')
      .where('action', '=', 'retouch.final_uploaded')
      .select('subjectId')
      .execute();
    expect(audit.map((entry) => entry.subjectId)).toEqual([row!.pickId]);
  });

  it('keeps a final when its sitter chooses another portrait and then the same one again', async () => {
    const done = (await queue()).rows.find((row) => row.hasFinal)!;
    const pick = await t.db
      .selectFrom('picks')
      .where('id', '=', done.pickId)
      .select(['dayId', 'personId', 'frameId', 'finalKey'])
      .executeTakeFirstOrThrow();
    const other = await t.db
      .selectFrom('frames')
      .where('dayId', '=', pick.dayId)
      .where('id', '!=', pick.frameId)
      .select('id')
      .executeTakeFirstOrThrow();
    // The sitter's two choices, as the proof page sends them (each a new pick id).
    const choose = (frameId: string) =>
      t.db.transaction().execute((trx) =>
        replacePicks(trx, {
          dayId: pick.dayId,
          personId: pick.personId,
          chosenBy: 'sitter',
          chosenByUserId: null,
          picks: [{ id: randomUUID(), frameId, note: null }],
        }),
      );
    await choose(other.id);
    await choose(pick.frameId);
    const back = await t.db
      .selectFrom('picks')
      .where('dayId', '=', pick.dayId)
      .where('personId', '=', pick.personId)
      .select(['id', 'frameId', 'finalKey', 'retouchStatus'])
      .execute();
    expect(back).toHaveLength(1);
    expect(back[0]).toMatchObject({
      frameId: pick.frameId,
      finalKey: pick.finalKey,
      retouchStatus: 'done',
    });
    await studio.get(`/api/picks/${back[0]!.id}/final`).expect(200);
  });

  it('says when the note changed after the final was sent, takes the pick again, and a new final settles it', async () => {
    const done = (await queue()).rows.find((row) => row.hasFinal)!;
    const pick = await t.db
      .selectFrom('picks')
      .where('id', '=', done.pickId)
      .select(['dayId', 'personId', 'frameId', 'note'])
      .executeTakeFirstOrThrow();
    const withNote = (note: string | null) =>
      t.db.transaction().execute((trx) =>
        replacePicks(trx, {
          dayId: pick.dayId,
          personId: pick.personId,
          chosenBy: 'sitter',
          chosenByUserId: null,
          picks: [{ id: randomUUID(), frameId: pick.frameId, note }],
        }),
      );
    const rowNow = async () =>
      (await queue()).rows.find((row) => row.pickId === done.pickId) as Row & {
        noteChangedSinceFinal: boolean;
        noteAtFinal: string | null;
      };
    // The same words again are no change.
    await withNote(pick.note);
    expect(await rowNow()).toMatchObject({ noteChangedSinceFinal: false });

    await withNote('Please also soften the collar shadow');
    expect(await rowNow()).toMatchObject({
      status: 'done',
      note: 'Please also soften the collar shadow',
      noteChangedSinceFinal: true,
      noteAtFinal: pick.note,
    });
    await studio
      .patch(`/api/picks/${done.pickId}`)
      .send({ status: 'in_progress', takenByMe: true })
      .expect(200);
    expect(await rowNow()).toMatchObject({ status: 'in_progress', takenByMe: true });
    const again = await sendFinal(
      done.pickId,
      done.fileName.replace('.JPG', '-collar.jpg'),
      await cameraJpeg({ width: 800, height: 600, shade: 180 }),
    );
    expect(again.status).toBe(204);
    expect(await rowNow()).toMatchObject({
      status: 'done',
      noteChangedSinceFinal: false,
      noteAtFinal: 'Please also soften the collar shadow',
    });
  });

  it('refuses a non-image or a huge image as a final, and changes nothing', async () => {
    const [, row] = (await queue('?status=to_do')).rows;
    const png = await sendFinal(row!.pickId, 'HPE_0999.png', await pngImage());
    expect(png.status).toBe(422);
    expect(png.body).toMatch(/send the final as JPEG, TIFF or HEIF/);
    const bomb = await sendFinal(row!.pickId, 'HPE_0998.jpg', await decompressionBomb());
    expect(bomb.status).toBe(422);
    expect(bomb.body).toMatch(/MP limit/);
    const wrongPick = await sendFinal(
      '00000000-0000-4000-8000-000000000009',
      'HPE_0997.jpg',
      await pngImage(),
    );
    expect(wrongPick.status).toBe(404);
    expect((await queue()).rows.find((each) => each.pickId === row!.pickId)).toMatchObject({
      hasFinal: false,
      status: 'to_do',
    });
  });
});
