import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertStaff } from '../factories/accounts';
import { startTestApp, type TestApp } from '../setup/test-app';
import { cameraJpeg } from '../support/camera-cards';
import { runQueuedJobs } from './booking-jobs';
import { signedInAgent } from './helpers';
import { setUpProofsDay } from './proofs-day';
import { createUpload, patchUpload } from './tus-client';

// Eye marks put down by hand on a photo the finder cannot read (the generated frames hold a
// slate, not a face) and a retouched final of the same size sent back afterwards.
let t: TestApp;
let ready: Awaited<ReturnType<typeof setUpProofsDay>>;

beforeAll(async () => {
  t = await startTestApp();
  ready = await setUpProofsDay(t, 1);
}, 120_000);
afterAll(async () => {
  await ready?.session.close();
  await t?.close();
});

const set = async () =>
  (await ready.studio.get(`/api/days/${ready.day.dayId}/set`).expect(200)).body;

describe('hand eye marks and a new final', () => {
  it('carry over to a final of the same size, and are looked at afresh on one of another size', async () => {
    const [sitter] = ready.sitters;
    const proofs = (await sitter!.agent.get(`/api/proofs/${ready.day.dayId}`).expect(200)).body;
    await sitter!.agent
      .put(`/api/proofs/${ready.day.dayId}/picks`)
      .send({ picks: [{ frameId: proofs.frames[0].id }] })
      .expect(200);
    const admin = await signedInAgent(t, (await insertStaff(t.db, { role: 'studio_admin' })).email);
    const { presets } = (await admin.get(`/api/clients/${ready.client.id}/look`).expect(200)).body;
    await admin
      .put(`/api/clients/${ready.client.id}/look`)
      .send({
        name: 'Staff directory',
        renditions: [presets[1].rendition],
        fileNameTemplate: '{employee_id}_{family}',
      })
      .expect(200);
    await ready.studio.post(`/api/days/${ready.day.dayId}/set/prepare`).expect(202);
    await runQueuedJobs(t);
    const before = (await set()).sitters[0];
    expect(before.needsAHand).toBe(true);
    const { imageWidth: width, imageHeight: height } = before.eyes;
    const marks = {
      leftEye: { x: Math.round(width * 0.45), y: Math.round(height * 0.4) },
      rightEye: { x: Math.round(width * 0.55), y: Math.round(height * 0.4) },
    };
    await ready.studio.put(`/api/picks/${before.pickId}/eyes`).send(marks).expect(200);
    await runQueuedJobs(t);

    const sendFinal = async (bytes: Buffer, name: string) => {
      const created = await createUpload(
        ready.session,
        { purpose: 'final', dayId: ready.day.dayId, pickId: before.pickId, cardPath: name },
        bytes.length,
      );
      expect(created.status, created.body).toBe(201);
      expect((await patchUpload(ready.session, created.url!, 0, bytes)).status).toBe(204);
      await ready.studio.post(`/api/days/${ready.day.dayId}/set/prepare`).expect(202);
      await runQueuedJobs(t);
      return (await set()).sitters[0];
    };
    const sameSize = await sendFinal(await cameraJpeg({ width, height, shade: 180 }), 'A-Edit.jpg');
    expect(sameSize.hasFinal).toBe(true);
    expect(sameSize.eyes).toMatchObject({
      status: 'marked',
      left: marks.leftEye,
      right: marks.rightEye,
    });
    const otherSize = await sendFinal(
      await cameraJpeg({ width: width * 2, height: height * 2, shade: 170 }),
      'A-Edit2.jpg',
    );
    expect(otherSize.needsAHand).toBe(true);
  });
});
