import type request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertOffice, insertPerson, insertStaff } from '../factories/accounts';
import { insertDayWithStations } from '../factories/shoot-days';
import { insertSitting } from '../factories/sittings';
import { startTestApp, type TestApp } from '../setup/test-app';
import { planCard, type CardPlan } from '../support/shoot-day-card';
import { runQueuedJobs } from './booking-jobs';
import { signedInAgent } from './helpers';
import { uploadCardAndMatch } from './card-upload';
import { openTusSession, type TusSession } from './tus-client';

// A generated card uploaded through tus, read by the ingest job and matched by the match job,
// on the real database. The day is in March in London (UTC+00:00); the camera's clock runs an
// hour and two minutes ahead (summer time set early, and drift), and its numbers roll over.
let t: TestApp;
let day: Awaited<ReturnType<typeof insertDayWithStations>>;
let otherDay: Awaited<ReturnType<typeof insertDayWithStations>>;
let session: TusSession;
let agent: request.Agent;
let plan: CardPlan;
let people: Array<{ id: string; clientId: string; employeeId: string | null }>;
let stranger: Awaited<ReturnType<typeof insertPerson>>;
let coordinatorEmail: string;
let otherPhotographerEmail: string;
const frameIdByPath = new Map<string, string>();

interface ListedFrame {
  id: string;
  cardPath: string;
  personId: string | null;
  employeeId: string | null;
  matchReason: string;
  manual: boolean;
  dcfFolder: number | null;
  dcfNumber: number | null;
  cameraSerial: string | null;
  capturedLocal: string | null;
}

async function listFrames(): Promise<ListedFrame[]> {
  const response = await agent.get(`/api/days/${day.dayId}/frames?pageSize=500`).expect(200);
  return response.body.frames;
}

async function review() {
  return (await agent.get(`/api/days/${day.dayId}/review`).expect(200)).body;
}

beforeAll(async () => {
  t = await startTestApp();
  const client = await insertClient(t.db);
  const office = await insertOffice(t.db, client.id);
  const photographer = await insertStaff(t.db, { role: 'photographer' });
  otherPhotographerEmail = (await insertStaff(t.db, { role: 'photographer' })).email;
  coordinatorEmail = (await insertStaff(t.db, { role: 'coordinator', clientId: client.id })).email;
  day = await insertDayWithStations(t.db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [photographer.id],
  });
  otherDay = await insertDayWithStations(t.db, {
    clientId: client.id,
    officeId: office.id,
    photographerIds: [photographer.id],
    date: '2027-03-05',
  });
  people = [];
  for (let index = 0; index < 3; index += 1) {
    const { id } = await insertPerson(t.db, client.id);
    people.push(
      await t.db
        .selectFrom('people')
        .where('id', '=', id)
        .select(['id', 'clientId', 'employeeId'])
        .executeTakeFirstOrThrow(),
    );
  }
  stranger = await insertPerson(t.db, (await insertClient(t.db)).id);
  plan = planCard({
    firstSittingAt: new Date('2027-03-04T09:00:00Z'),
    sittings: 3,
    framesPerSitting: 3,
    clockOffsetMs: 3_600_000 + 120_000,
    firstNumber: 9996,
    withoutSlate: [2],
  });
  for (const sitting of plan.sittings) {
    await insertSitting(t.db, {
      dayId: day.dayId,
      stationId: day.stations[0]!.id,
      personId: people[sitting.index]!.id,
      ...sitting,
    });
  }
  session = await openTusSession(t, photographer.email);
  agent = await signedInAgent(t, photographer.email);
  await uploadCardAndMatch(t, session, { dayId: day.dayId, stationId: day.stations[0]!.id }, plan);
  for (const frame of await listFrames()) frameIdByPath.set(frame.cardPath, frame.id);
}, 120_000);

afterAll(async () => {
  await session?.close();
  await t?.close();
});

describe('matching a day after its card is uploaded', () => {
  it('ties every frame of a sitting to its sitter, and leaves the test frame and the stray over', async () => {
    const frames = await listFrames();
    expect(frames).toHaveLength(plan.files.length);
    for (const file of plan.files) {
      const listed = frames.find((frame) => frame.cardPath === file.cardPath)!;
      const person = file.sitting === null ? null : people[file.sitting]!;
      expect({ path: file.cardPath, personId: listed.personId }).toEqual({
        path: file.cardPath,
        personId: person?.id ?? null,
      });
      expect(listed.employeeId).toBe(person?.employeeId ?? null);
      expect(listed.manual).toBe(false);
      expect(listed.cameraSerial).toBe('CV-40117');
      if (file.slate) expect(listed.matchReason).toBe('slate');
      if (file.sitting === null) expect(listed.matchReason).toBe('leftover');
    }
    // The rollover: the card runs 100/9996 … 100/9999, then 101/0001 …
    expect(frames.map((frame) => `${frame.dcfFolder}/${frame.dcfNumber}`)).toContain('101/1');
    // The sitting without a slate starts at its typed first frame.
    const unslated = plan.files.find((file) => file.sitting === 2)!;
    expect(frames.find((frame) => frame.cardPath === unslated.cardPath)?.matchReason).toMatch(
      /frame_number|capture_time/,
    );
  });

  it('shows the review: sitters in shooting order, counts, and the camera clock it found', async () => {
    const body = await review();
    expect(body.sitters.map((sitter: { personId: string }) => sitter.personId)).toEqual(
      people.map((person) => person.id),
    );
    expect(body.counts).toMatchObject({
      frames: plan.files.length,
      matched: plan.files.length - 2,
      conflicts: 0,
      leftovers: 2,
      sittersWithoutFrames: 0,
    });
    expect(body.lastRun.cameraOffsets).toEqual([{ camera: 'CV-40117', offsetMinutes: 62 }]);
    expect(body.matching).toBe(false);
  });

  it('gives the same list as CSV, with the path on the card and the employee id', async () => {
    const response = await agent.get(`/api/days/${day.dayId}/frames?format=csv`).expect(200);
    expect(response.headers['content-type']).toMatch(/^text\/csv/);
    const lines = response.text
      .replace(/^\uFEFF/, '')
      .trimEnd()
      .split('\r\n');
    expect(lines[0]).toBe(
      'Card path,Station,Camera serial,Folder,Frame number,Captured (camera clock),Person id,Employee id,Sitter,Reason,Placed by hand',
    );
    expect(lines).toHaveLength(plan.files.length + 1);
    const slate = plan.files.find((file) => file.slate && file.sitting === 0)!;
    const row = lines.find((line) => line.startsWith(`${slate.cardPath},`))!;
    expect(row).toContain(`,${people[0]!.id},${people[0]!.employeeId},`);
    expect(row).toContain('Shows this sitter’s slate,no');
  });

  it('keeps a frame moved by hand when the match runs again, and says what changed', async () => {
    const stray = plan.files[plan.files.length - 1]!;
    const strayId = frameIdByPath.get(stray.cardPath)!;
    // A double click: two identical requests at once record the change once.
    const clicks = await Promise.all(
      [1, 2].map(() =>
        agent
          .post(`/api/days/${day.dayId}/review/decisions`)
          .send({ action: 'move', frameIds: [strayId], personId: people[2]!.id })
          .expect(201),
      ),
    );
    expect(clicks.map((click) => click.body.repeated).sort()).toEqual([false, true]);
    expect(clicks[0]!.body.changeId).toBe(clicks[1]!.body.changeId);
    const recorded = await t.db
      .selectFrom('matchDecisions')
      .select('id')
      .where('frameId', '=', strayId)
      .execute();
    expect(recorded).toHaveLength(1);
    // Someone corrects the last sitting's first frame at the station: a match is queued by it.
    await t.db
      .updateTable('sittings')
      .set({ firstFrame: 9 })
      .where('slateToken', '=', plan.sittings[2]!.slateToken)
      .execute();
    const queued = await agent.get(`/api/days/${day.dayId}/review`).expect(200);
    expect(queued.body.matching).toBe(true);
    await agent.post(`/api/days/${day.dayId}/review/run`).expect(202);
    await runQueuedJobs(t);
    const frames = await listFrames();
    expect(frames.find((frame) => frame.id === strayId)).toMatchObject({
      personId: people[2]!.id,
      matchReason: 'manual',
      manual: true,
    });
    const body = await review();
    expect(body.matching).toBe(false);
    expect(body.lastRun.cause).toMatch(/sittings|on_demand/);
    expect(body.lastChange).toMatchObject({ action: 'move', frames: 1 });

    // Undo is each person's own: a colleague has nothing of theirs to take back.
    const colleague = await signedInAgent(t, (await insertStaff(t.db)).email);
    const theirs = await colleague.post(`/api/days/${day.dayId}/review/undo`).expect(409);
    expect(theirs.body.error.message).toBe('You have no change to undo.');
    // Undo takes the change back: the frame is a leftover again.
    await agent.post(`/api/days/${day.dayId}/review/undo`).expect(200);
    expect((await listFrames()).find((frame) => frame.id === strayId)?.matchReason).toBe(
      'leftover',
    );
    await agent.post(`/api/days/${day.dayId}/review/undo`).expect(409);
  });

  it('marks test frames, and splits frames off to someone photographed without a sitting', async () => {
    const test = frameIdByPath.get(plan.files[0]!.cardPath)!;
    await agent
      .post(`/api/days/${day.dayId}/review/decisions`)
      .send({ action: 'test_frame', frameIds: [test] })
      .expect(201);
    const split = plan.files.filter((file) => file.sitting === 1).slice(-2);
    const newcomer = await insertPerson(t.db, people[0]!.clientId);
    await agent
      .post(`/api/days/${day.dayId}/review/decisions`)
      .send({
        action: 'split',
        frameIds: split.map((file) => frameIdByPath.get(file.cardPath)),
        personId: newcomer.id,
      })
      .expect(201);
    const body = await review();
    expect(body.counts.testFrames).toBe(1);
    expect(body.sitters.at(-1)).toMatchObject({
      personId: newcomer.id,
      sittingId: null,
      frames: 2,
    });
    // A move needs someone photographed that day; a split does not.
    const refused = await agent
      .post(`/api/days/${day.dayId}/review/decisions`)
      .send({ action: 'move', frameIds: [test], personId: newcomer.id })
      .expect(400);
    expect(refused.body.error.message).toMatch(/not photographed today/);
  });

  it('refuses bad changes with a plain message and writes nothing', async () => {
    const before = await t.db.selectFrom('matchDecisions').select('id').execute();
    const frameId = frameIdByPath.get(plan.files[1]!.cardPath)!;
    const otherDayFrame = '00000000-0000-4000-8000-000000000001';
    const cases: Array<[object, RegExp]> = [
      [{ action: 'move', frameIds: [frameId] }, /Choose the sitter/],
      [{ action: 'test_frame', frameIds: [frameId], personId: people[0]!.id }, /belongs to nobody/],
      [{ action: 'move', frameIds: [], personId: people[0]!.id }, /at least one frame/],
      [{ action: 'move', frameIds: [frameId, frameId], personId: people[0]!.id }, /twice/],
      [{ action: 'move', frameIds: ['not-a-frame'], personId: people[0]!.id }, /./],
      [{ action: 'throw\u0000', frameIds: [frameId], personId: people[0]!.id }, /./],
      [
        { action: 'move', frameIds: [frameId, otherDayFrame], personId: people[0]!.id },
        /not part of this shoot day/,
      ],
      [{ action: 'move', frameIds: [frameId], personId: stranger.id }, /not on this client/],
      [{ action: 'move', frameIds: [frameId], personId: people[0]!.id, extra: 1 }, /./],
    ];
    for (const [body, message] of cases) {
      const response = await agent.post(`/api/days/${day.dayId}/review/decisions`).send(body);
      expect({ body, status: response.status }).toEqual({ body, status: 400 });
      expect(JSON.stringify(response.body.error)).toMatch(message);
    }
    // A frame of another day cannot be moved from this one.
    const elsewhere = await agent
      .post(`/api/days/${otherDay.dayId}/review/decisions`)
      .send({ action: 'test_frame', frameIds: [frameId] })
      .expect(400);
    expect(elsewhere.body.error.message).toMatch(/not part of this shoot day/);
    expect(await t.db.selectFrom('matchDecisions').select('id').execute()).toHaveLength(
      before.length,
    );
  });

  it('says which automatic results a re-run changed, and which of them a decision pins', async () => {
    // The middle sitting is undone at the station: its frames lose their sitter.
    await t.db
      .updateTable('sittings')
      .set({ undoneAt: new Date() })
      .where('slateToken', '=', plan.sittings[1]!.slateToken)
      .execute();
    await runQueuedJobs(t);
    const body = await review();
    expect(body.lastRun.cause).toBe('sittings');
    const own = plan.files.filter((file) => file.sitting === 1);
    expect(body.lastRun.changed).toBe(own.length);
    const names = new Set(body.lastRun.changes.map((change: { from: string }) => change.from));
    expect([...names]).toHaveLength(1);
    // The two frames split off by hand earlier keep their person; the run says so.
    expect(
      body.lastRun.changes.filter((change: { pinned: boolean }) => change.pinned),
    ).toHaveLength(2);
    expect(body.sitters.map((sitter: { personId: string }) => sitter.personId)).not.toContain(
      people[1]!.id,
    );
  });

  it('shows a coordinator counts only, and keeps other photographers out', async () => {
    const coordinator = await signedInAgent(t, coordinatorEmail);
    const counts = await coordinator.get(`/api/days/${day.dayId}/frames`).expect(200);
    expect(Object.keys(counts.body).sort()).toEqual(['counts', 'dayId']);
    expect(counts.body.counts.frames).toBe(plan.files.length);
    await coordinator.get(`/api/days/${day.dayId}/frames?format=csv`).expect(403);
    await coordinator.get(`/api/days/${day.dayId}/review`).expect(403);
    const other = await signedInAgent(t, otherPhotographerEmail);
    await other.get(`/api/days/${day.dayId}/review`).expect(403);
    await other.get(`/api/days/${day.dayId}/frames`).expect(403);
    await other.post(`/api/days/${day.dayId}/review/run`).expect(403);
  });
});
