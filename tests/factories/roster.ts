import type request from 'supertest';

type Agent = ReturnType<typeof request.agent>;

/** Uploads CSV text (or bytes) the way the browser does: raw bytes, file name in the query. */
export function uploadRoster(
  agent: Agent,
  clientId: string,
  content: string | Uint8Array,
  fileName = 'staff.csv',
) {
  const bytes = typeof content === 'string' ? Buffer.from(content, 'utf8') : Buffer.from(content);
  return agent
    .post(`/api/clients/${clientId}/roster/imports?fileName=${encodeURIComponent(fileName)}`)
    .set('Content-Type', 'application/octet-stream')
    .send(bytes);
}

/** A small invented roster of the demo client (names and addresses are made up). */
export function demoRosterCsv(
  rows: Array<[given: string, family: string, email: string, id: string, office: string]>,
): string {
  const header = 'Given Name,Surname,Work Email,Emp #,Office';
  return [header, ...rows.map((row) => row.join(','))].join('\r\n') + '\r\n';
}
