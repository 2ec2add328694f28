import path from 'node:path';
import { mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { parseEnvironment } from '../../server/config';
import { startTestApp, type TestApp } from '../setup/test-app';

// Header meanings: CSP (W3C Content Security Policy Level 3), nosniff (WHATWG Fetch,
// "X-Content-Type-Options"), HSTS (RFC 6797 section 7.2: a host sends it over secure transport
// only), no-store (RFC 9111 section 5.2.2.5).
let plain: TestApp;
let proxied: TestApp;
let listed: TestApp;
let folder: string;

beforeAll(async () => {
  folder = mkdtempSync(path.join(os.tmpdir(), 'likeness-headers-'));
  writeFileSync(path.join(folder, 'index.html'), '<!doctype html><title>app</title>');
  const frontend = { kind: 'static' as const, folder };
  plain = await startTestApp({ frontend });
  proxied = await startTestApp({ frontend, env: { TRUST_PROXY: 'true' } });
  // supertest connects from the loopback address; the listed proxy is somewhere else.
  listed = await startTestApp({ env: { TRUST_PROXY: '10.0.0.5, 10.1.0.0/16' } });
});
afterAll(async () => {
  await Promise.all([plain.close(), proxied.close(), listed.close()]);
  rmSync(folder, { recursive: true, force: true });
});

describe('security headers', () => {
  it('sends a CSP that allows only our own scripts, and nosniff, on the page and the API', async () => {
    for (const url of ['/', '/api/health']) {
      const response = await request(plain.app).get(url);
      const csp = String(response.headers['content-security-policy']);
      expect(csp, url).toMatch(/default-src 'self'/);
      expect(csp, url).toMatch(/script-src 'self' 'wasm-unsafe-eval'(;|$)/);
      expect(csp, url).toMatch(/frame-ancestors 'self'/);
      expect(csp, url).toMatch(/object-src 'none'/);
      expect(response.headers['x-content-type-options'], url).toBe('nosniff');
    }
  });

  it('marks every API answer no-store, errors included, but not the app page', async () => {
    for (const url of ['/api/health', '/api/session', '/api/no-such-route']) {
      const response = await request(plain.app).get(url);
      expect(response.headers['cache-control'], url).toBe('no-store');
    }
    const page = await request(plain.app).get('/sign-in');
    expect(page.headers['cache-control']).toBe('no-cache');
  });

  it('sends HSTS only when the request came over HTTPS', async () => {
    const overHttp = await request(plain.app).get('/api/health');
    expect(overHttp.headers['strict-transport-security']).toBeUndefined();
    // Without TRUST_PROXY a forwarded "https" is not believed.
    const spoofed = await request(plain.app).get('/api/health').set('X-Forwarded-Proto', 'https');
    expect(spoofed.headers['strict-transport-security']).toBeUndefined();

    const secure = await request(proxied.app).get('/').set('X-Forwarded-Proto', 'https');
    expect(secure.headers['strict-transport-security']).toBe('max-age=31536000');
    const secureApi = await request(proxied.app)
      .get('/api/health')
      .set('X-Forwarded-Proto', 'https');
    expect(secureApi.headers['strict-transport-security']).toBe('max-age=31536000');
    const insecure = await request(proxied.app).get('/api/health');
    expect(insecure.headers['strict-transport-security']).toBeUndefined();
  });

  it('believes X-Forwarded-* only from the listed proxy addresses', async () => {
    const direct = await request(listed.app).get('/api/health').set('X-Forwarded-Proto', 'https');
    expect(direct.headers['strict-transport-security']).toBeUndefined();
  });

  it('accepts a list of proxy addresses in TRUST_PROXY and refuses anything else', () => {
    expect(
      parseEnvironment({ TRUST_PROXY: '10.0.0.5,fd00::1, 10.1.0.0/16,loopback' }).TRUST_PROXY,
    ).toEqual(['10.0.0.5', 'fd00::1', '10.1.0.0/16', 'loopback']);
    expect(parseEnvironment({ TRUST_PROXY: 'true' }).TRUST_PROXY).toBe(true);
    for (const bad of ['10.0.0.999', 'proxy.example', '10.0.0.0/33', ',']) {
      expect(() => parseEnvironment({ TRUST_PROXY: bad }), bad).toThrow(/TRUST_PROXY/);
    }
  });
});
