import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertClient, insertPerson, insertStaff } from '../factories/accounts';
import { uploadRoster } from '../factories/roster';
import { startTestApp, type TestApp } from '../setup/test-app';
import { binaryBody, signedInAgent } from './helpers';

let t: TestApp;
beforeAll(async () => {
  t = await startTestApp();
});
afterAll(() => t.close());

async function coordinatorOfNewClient() {
  const client = await insertClient(t.db);
  const coordinator = await insertStaff(t.db, { role: 'coordinator', clientId: client.id });
  return { client, agent: await signedInAgent(t, coordinator.email) };
}

type Agent = Awaited<ReturnType<typeof coordinatorOfNewClient>>['agent'];

async function importFile(agent: Agent, clientId: string, file: string | Uint8Array, body = {}) {
  const draft = await uploadRoster(agent, clientId, file).expect(201);
  await agent
    .post(`/api/clients/${clientId}/roster/imports/${draft.body.id}/commit`)
    .send({ officeTimeZones: {}, ...body })
    .expect(201);
}

const people = (clientId: string) =>
  t.db
    .selectFrom('people')
    .select(['givenName', 'email', 'employeeId', 'active'])
    .where('clientId', '=', clientId)
    .orderBy('email')
    .execute();

const header = 'First name,Last name,E-mail,Employee id';

describe('an e-mail match with another employee id (issue 13, item 9)', () => {
  it('is a conflict counted on its own, left out unless confirmed, and never re-activates', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    await importFile(
      agent,
      client.id,
      `${header}\r\nAda,Pike,ada@hp.example,A-1\r\nBo,Lund,bo@hp.example,A-2\r\n`,
    );
    await t.db
      .updateTable('people')
      .set({ active: false })
      .where('email', '=', 'bo@hp.example')
      .execute();
    const file = `${header}\r\nAda,Pike,ada@hp.example,B-1\r\nBo,Lund,bo@hp.example,B-2\r\n`;
    const draft = await uploadRoster(agent, client.id, file).expect(201);
    expect(draft.body.counts).toMatchObject({ conflict: 2, update: 0, missing: 0 });
    const rows = await agent
      .get(`/api/clients/${client.id}/roster/imports/${draft.body.id}/rows?kind=conflict`)
      .expect(200);
    expect(rows.body.rows[0].errors.employeeId).toMatch(
      /belongs to Ada Pike, whose employee id is A-1; this row says B-1/,
    );
    // Conflicts are rows to fix too: they come with the file's rows in error.
    const toFix = await agent
      .get(`/api/clients/${client.id}/roster/imports/${draft.body.id}/errors.csv`)
      .expect(200);
    expect(toFix.text.split('\r\n')[1]).toMatch(
      /^Ada,Pike,ada@hp.example,B-1,"This e-mail belongs to Ada Pike/,
    );
    await agent
      .post(`/api/clients/${client.id}/roster/imports/${draft.body.id}/commit`)
      .send({ officeTimeZones: {} })
      .expect(201);
    expect(await people(client.id)).toEqual([
      { givenName: 'Ada', email: 'ada@hp.example', employeeId: 'A-1', active: true },
      { givenName: 'Bo', email: 'bo@hp.example', employeeId: 'A-2', active: false },
    ]);
    const history = await agent.get(`/api/clients/${client.id}/roster/history`).expect(200);
    expect(history.body.imports[0]).toMatchObject({ updated: 0, skipped: 2 });
  });

  it('confirmed as the same people, the ids change', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    await importFile(agent, client.id, `${header}\r\nAda,Pike,ada@hp.example,A-1\r\n`);
    await importFile(agent, client.id, `${header}\r\nAda,Pike,ada@hp.example,B-1\r\n`, {
      rekeyConflicts: true,
    });
    expect((await people(client.id))[0]?.employeeId).toBe('B-1');
  });
});

describe('people not in the file (issue 13, item 10)', () => {
  it('stay active unless the commit asks to mark them inactive', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    await importFile(
      agent,
      client.id,
      `${header}\r\nAda,Pike,ada@hp.example,A-1\r\nBo,Lund,bo@hp.example,A-2\r\n`,
    );
    await importFile(agent, client.id, `${header}\r\nAda,Pike,ada@hp.example,A-1\r\n`);
    expect((await people(client.id)).map((person) => person.active)).toEqual([true, true]);
    await importFile(agent, client.id, `${header}\r\nAda,Pike,ada@hp.example,A-1\r\n`, {
      deactivateMissing: true,
    });
    expect((await people(client.id)).map((person) => person.active)).toEqual([true, false]);
  });
});

describe('the rows-to-fix file (issue 13, item 12)', () => {
  const download = (agent: Agent, clientId: string, draftId: string) =>
    agent
      .get(`/api/clients/${clientId}/roster/imports/${draftId}/errors.csv`)
      .buffer(true)
      .parse(binaryBody)
      .expect(200);

  it('comes back semicolon-separated in Windows-1252 after such an upload', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    // Windows-1252 bytes (WHATWG index: é = 0xE9); a value holding ";" must be quoted.
    const text = 'Prénom;Nom;E-mail;Service\r\nRené;Dubois;;Design; Lyon\r\n'.replace(
      'Design; Lyon',
      '"Design; Lyon"',
    );
    const bytes = Uint8Array.from([...text], (char) => char.charCodeAt(0));
    const draft = await uploadRoster(agent, client.id, bytes).expect(201);
    expect(draft.body).toMatchObject({ encoding: 'windows-1252', delimiter: ';' });
    const file = await download(agent, client.id, draft.body.id);
    expect(file.headers['content-type']).toBe('text/csv; charset=windows-1252');
    const body = file.body as Buffer;
    expect(body.subarray(0, 3).equals(Buffer.from([0xef, 0xbb, 0xbf]))).toBe(false);
    expect(body.includes(0xe9)).toBe(true);
    expect(new TextDecoder('latin1').decode(body)).toBe(
      'Prénom;Nom;E-mail;Service;What to fix\r\nRené;Dubois;;"Design; Lyon";The e-mail is missing.\r\n',
    );
  });

  it('keeps UTF-16 with its byte order mark, and tab separators', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const text = 'First name\tLast name\tE-mail\r\nZoë\tMüller\tnot-an-address\r\n';
    const bytes = Buffer.concat([Buffer.from([0xff, 0xfe]), Buffer.from(text, 'utf16le')]);
    const draft = await uploadRoster(agent, client.id, bytes).expect(201);
    const file = await download(agent, client.id, draft.body.id);
    const body = file.body as Buffer;
    expect([...body.subarray(0, 2)]).toEqual([0xff, 0xfe]);
    expect(new TextDecoder('utf-16le').decode(body.subarray(2))).toBe(
      'First name\tLast name\tE-mail\tWhat to fix\r\nZoë\tMüller\tnot-an-address\tEnter a valid e-mail address, like name@example.com.\r\n',
    );
  });
});

describe('a Windows-1252 file and a stored name it cannot hold (issue 13, item 14)', () => {
  it('warns and keeps Łukasz instead of writing ?ukasz', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    await importFile(agent, client.id, `${header}\r\nŁukasz,Wróbel,lw@hp.example,A-1\r\n`);
    // What a spreadsheet program writes for Ł in Windows-1252 (from memory): "?"; ó = 0xF3.
    const legacy = `${header}\r\n?ukasz,Wróbel,lw@hp.example,A-1\r\n`;
    const bytes = Uint8Array.from([...legacy], (char) => char.charCodeAt(0));
    const draft = await uploadRoster(agent, client.id, bytes).expect(201);
    expect(draft.body.encoding).toBe('windows-1252');
    expect(draft.body.counts).toMatchObject({ unchanged: 1, update: 0 });
    const rows = await agent
      .get(`/api/clients/${client.id}/roster/imports/${draft.body.id}/rows?kind=unchanged`)
      .expect(200);
    expect(rows.body.rows[0].warnings.givenName).toMatch(/Kept “Łukasz”/);
    expect(draft.body.rowsWithWarnings).toBe(1);
    const warned = await agent
      .get(`/api/clients/${client.id}/roster/imports/${draft.body.id}/rows?kind=warned`)
      .expect(200);
    expect(warned.body.total).toBe(1);
    await agent
      .post(`/api/clients/${client.id}/roster/imports/${draft.body.id}/commit`)
      .send({ officeTimeZones: {} })
      .expect(201);
    expect((await people(client.id))[0]?.givenName).toBe('Łukasz');
  });
});

describe("the draft's count of rows with a warning", () => {
  it('is kept with the draft, and a remap that ignores the warned column clears it', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    // A vertical tab (U+000B) inside a department: decoding removes it and warns on that row.
    const file = `${header},Department\r\nAda,Pike,ap@hp.example,A-1,Struc\u000btures\r\nBo,Reed,br@hp.example,A-2,Design\r\n`;
    const draft = await uploadRoster(agent, client.id, file).expect(201);
    expect(draft.body.rowsWithWarnings).toBe(1);
    const imports = `/api/clients/${client.id}/roster/imports/${draft.body.id}`;
    expect((await agent.get(imports).expect(200)).body.rowsWithWarnings).toBe(1);

    const ignored = [...draft.body.mapping.slice(0, 4), 'ignore'];
    const remapped = await agent.put(`${imports}/mapping`).send({ mapping: ignored }).expect(200);
    expect(remapped.body.rowsWithWarnings).toBe(0);
    expect((await agent.get(imports).expect(200)).body.rowsWithWarnings).toBe(0);
    const warned = await agent.get(`${imports}/rows?kind=warned`).expect(200);
    expect(warned.body.total).toBe(0);
  });
});

describe('an import replaced by a newer upload', () => {
  it('answers that it is no longer open and why, not only "not found"', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const first = await uploadRoster(
      agent,
      client.id,
      `${header}\r\nAda,Pike,ap@hp.example,A-1\r\n`,
    );
    await uploadRoster(agent, client.id, `${header}\r\nBo,Reed,br@hp.example,A-2\r\n`).expect(201);
    const response = await agent
      .post(`/api/clients/${client.id}/roster/imports/${first.body.id}/commit`)
      .send({ officeTimeZones: {} })
      .expect(404);
    expect(response.body.error.message).toMatch(
      /no longer open: it was saved, replaced by a newer upload of yours/,
    );
    expect(await people(client.id)).toEqual([]);
  });
});

describe('blank lines in the file', () => {
  it('leave every row numbered as a spreadsheet shows it, after a remap and in the rows to fix', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    // Rows 1 to 7 as a spreadsheet numbers them (common practice: one row per RFC 4180 record,
    // blank records included): 3 and 4 are blank, the quoted cell of row 6
    // spans two lines of text but is one row.
    const file = [
      header,
      'Ada,Pike,ap@hp.example,A-1',
      '',
      ',,,',
      'Bo,Reed,bad-email,A-2',
      '"Cy\nRoss",Lund,cl@hp.example,A-3',
      'Di,Moss,also-bad,A-4',
      '',
    ].join('\r\n');
    const draft = await uploadRoster(agent, client.id, file).expect(201);
    const imports = `/api/clients/${client.id}/roster/imports/${draft.body.id}`;
    const numbers = async () => {
      const page = await agent.get(`${imports}/rows?kind=all`).expect(200);
      return page.body.rows.map((row: { rowNumber: number; kind: string }) => [
        row.rowNumber,
        row.kind,
      ]);
    };
    const expected = [
      [2, 'add'],
      [5, 'error'],
      [6, 'add'],
      [7, 'error'],
    ];
    expect(await numbers()).toEqual(expected);
    await agent.put(`${imports}/mapping`).send({ mapping: draft.body.mapping }).expect(200);
    expect(await numbers()).toEqual(expected);

    const fix = await agent.get(`${imports}/errors.csv`).buffer(true).parse(binaryBody).expect(200);
    const lines = (fix.body as Buffer)
      .toString('utf8')
      .replace(/^\uFEFF/, '')
      .split('\r\n');
    expect(lines.slice(1, 3).map((line) => line.split(',').slice(0, 3).join(','))).toEqual([
      'Bo,Reed,bad-email',
      'Di,Moss,also-bad',
    ]);
  });

  it('before the header are passed over, and the rows under it keep their spreadsheet numbers', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    // Rows 1 and 2 blank (one of them only separators), the header on row 3 (common practice:
    // one spreadsheet row per RFC 4180 record, blank records included).
    const file = ['', ',,,', header, 'Ada,Pike,ap@hp.example,A-1', 'Bo,Reed,bad-email,A-2'].join(
      '\r\n',
    );
    const draft = await uploadRoster(agent, client.id, file).expect(201);
    expect(draft.body.headers).toEqual(header.split(','));
    const page = await agent
      .get(`/api/clients/${client.id}/roster/imports/${draft.body.id}/rows?kind=all`)
      .expect(200);
    expect(
      page.body.rows.map((row: { rowNumber: number; kind: string }) => [row.rowNumber, row.kind]),
    ).toEqual([
      [4, 'add'],
      [5, 'error'],
    ]);
  });

  it('are counted in the row a too-long cell is reported on', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const file = `${header}\r\n\r\n\r\nAda,${'x'.repeat(2001)},ap@hp.example,A-1\r\n`;
    const response = await uploadRoster(agent, client.id, file).expect(422);
    expect(response.body.error.message).toMatch(/^Row 4, column "Last name"/);
  });
});

describe('an import left open', () => {
  it('is offered again to its uploader only, until it is saved', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const open = `/api/clients/${client.id}/roster/open-import`;
    expect((await agent.get(open).expect(200)).body).toEqual({ draft: null });
    const draft = await uploadRoster(
      agent,
      client.id,
      `${header}\r\nAda,Pike,ap@hp.example,A-1\r\n`,
    );
    const again = await agent.get(open).expect(200);
    expect(again.body.draft).toMatchObject({ id: draft.body.id, counts: draft.body.counts });

    const colleague = await insertStaff(t.db, { role: 'coordinator', clientId: client.id });
    const other = await signedInAgent(t, colleague.email);
    expect((await other.get(open).expect(200)).body).toEqual({ draft: null });

    await agent
      .post(`/api/clients/${client.id}/roster/imports/${draft.body.id}/commit`)
      .send({ officeTimeZones: {} })
      .expect(201);
    expect((await agent.get(open).expect(200)).body).toEqual({ draft: null });
  });
});

describe('values past the last named column', () => {
  it('are left out with a warning on their row; empty trailing cells are not', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const file = [
      header,
      'Ada,Pike,ap@hp.example,A-1,Leeds,Design',
      'Bo,Reed,br@hp.example,A-2,,',
      'Cy,Lund,cl@hp.example,A-3',
    ].join('\r\n');
    const draft = await uploadRoster(agent, client.id, file).expect(201);
    expect(draft.body.rowsWithWarnings).toBe(1);
    const imports = `/api/clients/${client.id}/roster/imports/${draft.body.id}`;
    const warned = await agent.get(`${imports}/rows?kind=warned`).expect(200);
    expect(warned.body.rows).toHaveLength(1);
    expect(warned.body.rows[0].rowNumber).toBe(2);
    expect(warned.body.rows[0].warnings).toEqual({
      'Past the last column':
        '2 values were left out: the header has no columns for them. Add column names to the header, or remove the values.',
    });
    // A remap keeps the warning: it comes from the file, not from the columns chosen.
    const remapped = await agent
      .put(`${imports}/mapping`)
      .send({ mapping: draft.body.mapping })
      .expect(200);
    expect(remapped.body.rowsWithWarnings).toBe(1);
  });
});

describe('the rows to fix, uploaded again unedited', () => {
  it('are ignored in their reasons column, and their own rows to fix hold one such column', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const first = await uploadRoster(agent, client.id, `${header}\r\nBo,Reed,bad-email,A-2\r\n`);
    const fix = await agent
      .get(`/api/clients/${client.id}/roster/imports/${first.body.id}/errors.csv`)
      .buffer(true)
      .parse(binaryBody)
      .expect(200);
    const again = await uploadRoster(agent, client.id, fix.body as Buffer).expect(201);
    expect(again.body.headers.at(-1)).toBe('What to fix');
    expect(again.body.mapping.at(-1)).toBe('ignore');
    const fixAgain = await agent
      .get(`/api/clients/${client.id}/roster/imports/${again.body.id}/errors.csv`)
      .buffer(true)
      .parse(binaryBody)
      .expect(200);
    const lines = (fixAgain.body as Buffer)
      .toString('utf8')
      .replace(/^\uFEFF/, '')
      .split('\r\n');
    expect(lines.slice(0, 2)).toEqual([
      'First name,Last name,E-mail,Employee id,What to fix',
      'Bo,Reed,bad-email,A-2,"Enter a valid e-mail address, like name@example.com."',
    ]);
  });
});

describe('a status column (our own export writes one)', () => {
  it('keeps a leaver in the file inactive, makes someone it calls inactive so, and refuses a word it cannot read', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    await insertPerson(t.db, client.id, {
      email: 'left@hp.example',
      active: false,
      givenName: 'Lev',
    });
    await insertPerson(t.db, client.id, { email: 'going@hp.example', givenName: 'Gia' });
    const file = [
      'First name,Last name,E-mail,Status',
      'Lev,Sample,left@hp.example,Inactive',
      'Gia,Sample,going@hp.example,inactive',
      'Nell,Sample,new@hp.example,Active',
      'Max,Sample,unsure@hp.example,maybe',
    ].join('\r\n');
    const draft = await uploadRoster(agent, client.id, file).expect(201);
    expect(draft.body.mapping).toEqual(['givenName', 'familyName', 'email', 'status']);
    const page = await agent
      .get(`/api/clients/${client.id}/roster/imports/${draft.body.id}/rows?kind=all`)
      .expect(200);
    const byEmail = Object.fromEntries(
      page.body.rows.map((row: { values: { email: string } }) => [row.values.email, row]),
    );
    // The factory's family names differ from the file's, so both rows update that field too.
    expect(byEmail['left@hp.example'].values.active).toBe(false);
    expect(byEmail['left@hp.example'].changedFields).not.toContain('active');
    expect(byEmail['going@hp.example'].values.active).toBe(false);
    expect(byEmail['going@hp.example'].changedFields).toContain('active');
    expect(byEmail['new@hp.example']).toMatchObject({ kind: 'add', values: { active: true } });
    expect(byEmail['unsure@hp.example']).toMatchObject({
      kind: 'error',
      errors: { active: 'Write Active or Inactive here, or leave it blank.' },
    });
    await agent
      .post(`/api/clients/${client.id}/roster/imports/${draft.body.id}/commit`)
      .send({ officeTimeZones: {} })
      .expect(201);
    expect((await people(client.id)).map((person) => [person.email, person.active])).toEqual([
      ['going@hp.example', false],
      ['left@hp.example', false],
      ['new@hp.example', true],
    ]);
  });

  it('without one, being in the file still makes an inactive person active again', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    await insertPerson(t.db, client.id, { email: 'back@hp.example', active: false });
    await importFile(
      agent,
      client.id,
      'First name,Last name,E-mail\r\nBea,Sample,back@hp.example\r\n',
    );
    expect((await people(client.id)).map((person) => person.active)).toEqual([true]);
  });
});

describe('the directory export imported again', () => {
  it('changes nobody: leavers stay inactive', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    await importFile(
      agent,
      client.id,
      'First name,Last name,E-mail\r\nAda,Pike,ada@hp.example\r\nBo,Reed,bo@hp.example\r\n',
    );
    await t.db
      .updateTable('people')
      .set({ active: false })
      .where('email', '=', 'bo@hp.example')
      .execute();
    const exported = await agent
      .get(`/api/clients/${client.id}/people/export.csv?status=all`)
      .buffer(true)
      .parse(binaryBody)
      .expect(200);
    const draft = await uploadRoster(agent, client.id, exported.body as Buffer).expect(201);
    expect(draft.body.counts).toMatchObject({ add: 0, update: 0, unchanged: 2, error: 0 });
  });
});

describe("a draft's file (migration 2026-12-20T0900)", () => {
  const file = `${header},Department\r\nAda,Pike,ap@hp.example,A-1,Struc\u000btures\r\nBo,Reed,ap@hp.example,A-2,Design\r\n`;

  it('is kept as the uploaded bytes, and a remap and the rows to fix read its rows from them', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const draft = await uploadRoster(agent, client.id, file).expect(201);
    const stored = await t.db
      .selectFrom('rosterImportDrafts')
      .innerJoin('rosterImportFiles', 'rosterImportFiles.draftId', 'rosterImportDrafts.id')
      .select(['bytes', 'rawRows'])
      .where('id', '=', draft.body.id)
      .executeTakeFirstOrThrow();
    expect(stored.rawRows).toBeNull();
    expect(stored.bytes.toString('utf8')).toBe(file);

    const imports = `/api/clients/${client.id}/roster/imports/${draft.body.id}`;
    const remapped = await agent
      .put(`${imports}/mapping`)
      .send({ mapping: [...draft.body.mapping.slice(0, 4), 'department'] })
      .expect(200);
    // Parsed again: the control character's warning and the repeated e-mail are found again.
    expect(remapped.body).toMatchObject({ rowsWithWarnings: 1, counts: { add: 1, error: 1 } });
    const toFix = await agent.get(`${imports}/errors.csv`).expect(200);
    expect(toFix.text.split('\r\n')[1]).toMatch(/^Bo,Reed,ap@hp\.example,A-2,Design,/);
  });

  it('of a draft from before, kept as rows of JSON, is still remapped and gives its rows to fix', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const draft = await uploadRoster(agent, client.id, file).expect(201);
    const rows = [
      ['Ada', 'Pike', 'ap@hp.example', 'A-1', 'Structures'],
      ['Bo', 'Reed', 'ap@hp.example', 'A-2', 'Design'],
    ];
    await t.db.deleteFrom('rosterImportFiles').where('draftId', '=', draft.body.id).execute();
    await t.db
      .updateTable('rosterImportDrafts')
      .set({ rawRows: JSON.stringify(rows), decodeWarnings: '[]' })
      .where('id', '=', draft.body.id)
      .execute();
    const imports = `/api/clients/${client.id}/roster/imports/${draft.body.id}`;
    const remapped = await agent
      .put(`${imports}/mapping`)
      .send({ mapping: [...draft.body.mapping.slice(0, 4), 'department'] })
      .expect(200);
    expect(remapped.body).toMatchObject({ rowsWithWarnings: 0, counts: { add: 1, error: 1 } });
    const toFix = await agent.get(`${imports}/errors.csv`).expect(200);
    expect(toFix.text.split('\r\n')[1]).toMatch(/^Bo,Reed,ap@hp\.example,A-2,Design,/);
  });

  it("read otherwise or refused by today's rules, asks for the file again (409), never a 500", async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const imports = async () => {
      const draft = await uploadRoster(agent, client.id, file).expect(201);
      return { draft, url: `/api/clients/${client.id}/roster/imports/${draft.body.id}` };
    };
    // As if the rules had read another header when it was uploaded.
    const renamed = await imports();
    await t.db
      .updateTable('rosterImportDrafts')
      .set({ headers: JSON.stringify(['Given', 'Family', 'Mail', 'Id', 'Team']) })
      .where('id', '=', renamed.draft.body.id)
      .execute();
    const remap = await agent
      .put(`${renamed.url}/mapping`)
      .send({ mapping: renamed.draft.body.mapping })
      .expect(409);
    expect(remap.body.error.code).toBe('draft_read_otherwise');
    // As if today's rules refused the bytes kept.
    const refused = await imports();
    await t.db
      .updateTable('rosterImportFiles')
      .set({ bytes: Buffer.from('E-mail\r\n') })
      .where('draftId', '=', refused.draft.body.id)
      .execute();
    const toFix = await agent.get(`${refused.url}/errors.csv`).expect(409);
    expect(toFix.body.error.message).toMatch(/Upload the file again/);
  });

  it('goes with its draft, and a refused file leaves neither behind', async () => {
    const { client, agent } = await coordinatorOfNewClient();
    const first = await uploadRoster(agent, client.id, file).expect(201);
    // A newer upload by the same coordinator replaces the first draft, file and all.
    const second = await uploadRoster(agent, client.id, file).expect(201);
    await uploadRoster(agent, client.id, 'E-mail\r\n').expect(422);
    const files = await t.db
      .selectFrom('rosterImportFiles')
      .select('draftId')
      .where('draftId', 'in', [first.body.id, second.body.id])
      .execute();
    expect(files.map((row) => row.draftId)).toEqual([second.body.id]);
    const drafts = await t.db
      .selectFrom('rosterImportDrafts')
      .select('id')
      .where('clientId', '=', client.id)
      .execute();
    expect(drafts.map((row) => row.id)).toEqual([second.body.id]);
  });
});
