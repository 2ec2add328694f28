import http from 'node:http';
import type { AddressInfo } from 'node:net';
import type { TestApp } from '../setup/test-app';
import { TEST_PASSWORD } from '../factories/accounts';

/**
 * A bare tus 1.0 client over node:http, so a test can do what a dropped venue connection does:
 * stop a PATCH after some bytes, ask the server for its offset, and send the rest.
 */
export interface TusSession {
  origin: string;
  cookie: string;
  close(): Promise<void>;
}

export async function openTusSession(t: TestApp, email: string): Promise<TusSession> {
  const server = t.app.listen(0, '127.0.0.1');
  await new Promise<void>((resolve) => server.once('listening', () => resolve()));
  const origin = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  const response = await fetch(`${origin}/api/session`, {
    method: 'POST',
    headers: { 'Content-Type': 'application/json' },
    body: JSON.stringify({ email, password: TEST_PASSWORD }),
  });
  if (response.status !== 201) throw new Error(`sign-in answered ${response.status}`);
  const cookie = (response.headers.get('set-cookie') ?? '').split(';')[0] ?? '';
  return {
    origin,
    cookie,
    close: () =>
      new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      }),
  };
}

export function encodeMetadata(metadata: Record<string, string>): string {
  return Object.entries(metadata)
    .map(([key, value]) => `${key} ${Buffer.from(value).toString('base64')}`)
    .join(',');
}

interface Answer {
  status: number;
  headers: Headers;
  body: string;
}

async function answer(response: Response): Promise<Answer> {
  return { status: response.status, headers: response.headers, body: await response.text() };
}

export async function createUpload(
  session: TusSession,
  metadata: Record<string, string>,
  size: number,
  extraHeaders: Record<string, string> = {},
): Promise<Answer & { url: string | null }> {
  const response = await fetch(`${session.origin}/api/uploads`, {
    method: 'POST',
    headers: {
      Cookie: session.cookie,
      'Tus-Resumable': '1.0.0',
      'Upload-Length': String(size),
      'Upload-Metadata': encodeMetadata(metadata),
      ...extraHeaders,
    },
  });
  const location = response.headers.get('location');
  return {
    ...(await answer(response)),
    url: location ? new URL(location, session.origin).href : null,
  };
}

export async function uploadOffset(
  session: TusSession,
  url: string,
): Promise<Answer & { offset: number }> {
  const response = await fetch(url, {
    method: 'HEAD',
    headers: { Cookie: session.cookie, 'Tus-Resumable': '1.0.0' },
  });
  return {
    ...(await answer(response)),
    offset: Number(response.headers.get('upload-offset') ?? -1),
  };
}

export async function patchUpload(
  session: TusSession,
  url: string,
  offset: number,
  bytes: Buffer,
  cookie = session.cookie,
): Promise<Answer> {
  const response = await fetch(url, {
    method: 'PATCH',
    headers: {
      Cookie: cookie,
      'Tus-Resumable': '1.0.0',
      'Upload-Offset': String(offset),
      'Content-Type': 'application/offset+octet-stream',
    },
    body: new Uint8Array(bytes),
  });
  return answer(response);
}

/** Sends `bytes` but cuts the connection once `cutAfter` of them are on the wire. */
export function patchAndDrop(
  session: TusSession,
  url: string,
  offset: number,
  bytes: Buffer,
  cutAfter: number,
): Promise<void> {
  return new Promise((resolve) => {
    const request = http.request(url, {
      method: 'PATCH',
      headers: {
        Cookie: session.cookie,
        'Tus-Resumable': '1.0.0',
        'Upload-Offset': String(offset),
        'Content-Type': 'application/offset+octet-stream',
        'Content-Length': String(bytes.length),
      },
    });
    request.on('error', () => resolve());
    request.on('close', () => resolve());
    request.write(bytes.subarray(0, cutAfter), () => {
      // Give the server a moment to write what it received, then drop the line.
      setTimeout(() => request.destroy(), 200);
    });
  });
}
