import { X509Certificate } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import https from 'node:https';
import type { RequestListener } from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { generate } from 'selfsigned';

/**
 * A certificate made on this computer so `npm start` on the studio network serves HTTPS:
 * tablets only allow the camera (pass scanning) and offline install on a secure page.
 * It is its own authority (basicConstraints cA), so a tablet can be told to trust it.
 */

export const CERTIFICATE_PATH = '/likeness-local.crt';
const DAY = 86_400_000;
// Kept under the 825-day limit some tablets put on server certificates (common practice).
const VALID_DAYS = 397;
const RENEW_WHEN_DAYS_LEFT = 30;

export interface LocalCertificate {
  certPath: string;
  keyPath: string;
  cert: string;
  key: string;
  /** SHA-256 fingerprint, as tablets show it, so the person installing it can compare. */
  fingerprint: string;
  /** True when this call made a new one (none yet, expiring, or a name it did not cover). */
  created: boolean;
}

const isLoopback = (host: string) =>
  host === 'localhost' || host === '::1' || host.startsWith('127.');

/**
 * HTTPS is served when the app listens beyond this computer and no proxy in front of it
 * already speaks TLS (TRUST_PROXY says one does).
 */
export function servesLocalHttps(host: string, trustProxy: boolean | readonly string[]): boolean {
  // Behind a proxy (one hop, or a list of proxy addresses) the proxy speaks TLS, not us.
  const behindProxy = Array.isArray(trustProxy) ? trustProxy.length > 0 : trustProxy === true;
  return !isLoopback(host) && !behindProxy;
}

/** The IPv4 addresses tablets on the studio network can reach this computer at. */
export function lanAddresses(): string[] {
  return Object.values(os.networkInterfaces())
    .flat()
    .filter((entry) => entry && entry.family === 'IPv4' && !entry.internal)
    .map((entry) => entry!.address);
}

function covers(certificate: X509Certificate, names: string[], ips: string[], now: Date) {
  const left = new Date(certificate.validTo).getTime() - now.getTime();
  return (
    left > RENEW_WHEN_DAYS_LEFT * DAY &&
    names.every((name) => certificate.checkHost(name) !== undefined) &&
    ips.every((ip) => certificate.checkIP(ip) !== undefined)
  );
}

/** The certificate kept in `folder`, made again only when it no longer fits. */
export async function ensureLocalCertificate(
  folder: string,
  reach: { names: string[]; ips: string[] },
  now = new Date(),
): Promise<LocalCertificate> {
  const certPath = path.join(folder, 'likeness-local.crt');
  const keyPath = path.join(folder, 'likeness-local.key');
  const names = [...new Set(['localhost', ...reach.names])];
  const ips = [...new Set(['127.0.0.1', ...reach.ips])];
  if (existsSync(certPath) && existsSync(keyPath)) {
    const cert = readFileSync(certPath, 'utf8');
    const parsed = new X509Certificate(cert);
    if (covers(parsed, names, ips, now)) {
      const key = readFileSync(keyPath, 'utf8');
      return { certPath, keyPath, cert, key, fingerprint: parsed.fingerprint256, created: false };
    }
  }
  const made = await generate([{ name: 'commonName', value: 'Likeness on this network' }], {
    keySize: 2048,
    algorithm: 'sha256',
    notBeforeDate: new Date(now.getTime() - DAY),
    notAfterDate: new Date(now.getTime() + VALID_DAYS * DAY),
    extensions: [
      { name: 'basicConstraints', cA: true, critical: true },
      { name: 'keyUsage', digitalSignature: true, keyEncipherment: true, keyCertSign: true },
      { name: 'extKeyUsage', serverAuth: true },
      {
        name: 'subjectAltName',
        altNames: [
          ...names.map((value) => ({ type: 2 as const, value })),
          ...ips.map((ip) => ({ type: 7 as const, ip })),
        ],
      },
    ],
  });
  mkdirSync(folder, { recursive: true });
  writeFileSync(certPath, made.cert);
  writeFileSync(keyPath, made.private, { mode: 0o600 });
  const fingerprint = new X509Certificate(made.cert).fingerprint256;
  return { certPath, keyPath, cert: made.cert, key: made.private, fingerprint, created: true };
}

/** The HTTPS server, which also hands out the certificate itself for tablets to install. */
export function createLocalHttpsServer(app: RequestListener, certificate: LocalCertificate) {
  return https.createServer({ cert: certificate.cert, key: certificate.key }, (req, res) => {
    if (req.method === 'GET' && req.url === CERTIFICATE_PATH) {
      res.writeHead(200, {
        'Content-Type': 'application/x-x509-ca-cert',
        'Content-Disposition': 'attachment; filename="likeness-local.crt"',
      });
      res.end(certificate.cert);
      return;
    }
    app(req, res);
  });
}

/** What `npm start` prints: how to make a tablet trust the certificate. */
export function trustInstructions(baseUrl: string, certificate: LocalCertificate): string[] {
  return [
    `HTTPS uses a certificate made on this computer (${certificate.certPath}).`,
    'To trust it on a tablet (once per tablet):',
    `  1. On the tablet open ${baseUrl}${CERTIFICATE_PATH}, accept the warning once, and download it.`,
    "  2. Install it in the tablet's security settings as a trusted (CA) certificate; where the",
    '     tablet has a separate switch for full trust of installed certificates, turn it on.',
    `  3. Open ${baseUrl} again: no warning, and pass scanning and the offline console work.`,
    `  Check the fingerprint the tablet shows: SHA-256 ${certificate.fingerprint}`,
  ];
}
