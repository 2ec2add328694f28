import { X509Certificate } from 'node:crypto';
import { mkdtempSync, rmSync, statSync } from 'node:fs';
import https from 'node:https';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import {
  CERTIFICATE_PATH,
  createLocalHttpsServer,
  ensureLocalCertificate,
  servesLocalHttps,
  trustInstructions,
} from '../../scripts/lib/local-certificate';
import { startTestApp, type TestApp } from '../setup/test-app';

// The certificate is read back with Node's own X.509 parser (OpenSSL), independent of the
// package that made it, and used by a real TLS handshake that trusts only it.

let folder: string;
let t: TestApp;

beforeAll(async () => {
  folder = mkdtempSync(path.join(os.tmpdir(), 'likeness-tls-'));
  t = await startTestApp();
});

afterAll(async () => {
  rmSync(folder, { recursive: true, force: true });
  await t.close();
});

function get(port: number, pathname: string, ca: string) {
  return new Promise<{ status: number; body: string; type: string }>((resolve, reject) => {
    const req = https.get({ host: '127.0.0.1', port, path: pathname, ca }, (res) => {
      let body = '';
      res.setEncoding('utf8');
      res.on('data', (chunk: string) => (body += chunk));
      res.on('end', () =>
        resolve({ status: res.statusCode ?? 0, body, type: res.headers['content-type'] ?? '' }),
      );
    });
    req.on('error', reject);
  });
}

describe('HTTPS on the studio network', () => {
  it('is served when listening beyond this computer, not on loopback or behind a TLS proxy', () => {
    expect(servesLocalHttps('0.0.0.0', false)).toBe(true);
    expect(servesLocalHttps('192.168.40.12', false)).toBe(true);
    expect(servesLocalHttps('127.0.0.1', false)).toBe(false);
    expect(servesLocalHttps('localhost', false)).toBe(false);
    expect(servesLocalHttps('0.0.0.0', true)).toBe(false);
  });

  it('makes a certificate for the LAN address, keeps it, and makes a new one for a new address', async () => {
    const tls = path.join(folder, 'tls');
    const made = await ensureLocalCertificate(tls, {
      names: ['studio-laptop'],
      ips: ['10.20.30.40'],
    });
    expect(made.created).toBe(true);
    const parsed = new X509Certificate(made.cert);
    // RFC 5280 §4.2.1.6: the names a client checks are in subjectAltName.
    expect(parsed.checkIP('10.20.30.40')).toBe('10.20.30.40');
    expect(parsed.checkIP('127.0.0.1')).toBe('127.0.0.1');
    expect(parsed.checkHost('studio-laptop')).toBe('studio-laptop');
    expect(parsed.ca).toBe(true);
    expect(parsed.verify(parsed.publicKey)).toBe(true);
    expect(statSync(made.keyPath).mode & 0o777).toBe(0o600);

    const again = await ensureLocalCertificate(tls, {
      names: ['studio-laptop'],
      ips: ['10.20.30.40'],
    });
    expect(again.created).toBe(false);
    expect(again.fingerprint).toBe(made.fingerprint);

    const moved = await ensureLocalCertificate(tls, {
      names: ['studio-laptop'],
      ips: ['10.20.30.41'],
    });
    expect(moved.created).toBe(true);
    expect(new X509Certificate(moved.cert).checkIP('10.20.30.41')).toBe('10.20.30.41');

    const nearExpiry = new Date(Date.now() + 380 * 86_400_000);
    const renewed = await ensureLocalCertificate(
      tls,
      { names: ['studio-laptop'], ips: ['10.20.30.41'] },
      nearExpiry,
    );
    expect(renewed.created).toBe(true);
  });

  it('serves the app over TLS that trusts only this certificate, and hands the certificate out', async () => {
    const certificate = await ensureLocalCertificate(path.join(folder, 'served'), {
      names: [],
      ips: [],
    });
    const server = createLocalHttpsServer(t.app, certificate);
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    const { port } = server.address() as AddressInfo;
    try {
      const health = await get(port, '/api/health', certificate.cert);
      expect(health.status).toBe(200);
      expect(JSON.parse(health.body).database.state).toBe('up');
      const download = await get(port, CERTIFICATE_PATH, certificate.cert);
      expect(download.status).toBe(200);
      expect(download.type).toBe('application/x-x509-ca-cert');
      expect(new X509Certificate(download.body).fingerprint256).toBe(certificate.fingerprint);
      // A client that does not trust it refuses the connection.
      await expect(
        new Promise((resolve, reject) =>
          https.get({ host: '127.0.0.1', port, path: '/api/health' }, resolve).on('error', reject),
        ),
      ).rejects.toThrow(/self.signed|certificate/i);
      const lines = trustInstructions(`https://127.0.0.1:${port}`, certificate).join('\n');
      expect(lines).toContain(`https://127.0.0.1:${port}${CERTIFICATE_PATH}`);
      expect(lines).toContain(certificate.fingerprint);
    } finally {
      await new Promise<void>((resolve) => {
        server.close(() => resolve());
        server.closeAllConnections();
      });
    }
  });
});
