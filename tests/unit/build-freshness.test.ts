import { mkdirSync, mkdtempSync, rmSync, utimesSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { browserBuildIsCurrent } from '../../scripts/lib/build-freshness';

// npm start serves dist/ without building (and without Vite) only when it is newer than
// every source of the browser app.

let root: string;
afterEach(() => rmSync(root, { recursive: true, force: true }));

function project(times: { source: number; build?: number }) {
  root = mkdtempSync(path.join(os.tmpdir(), 'likeness-build-'));
  mkdirSync(path.join(root, 'src', 'app'), { recursive: true });
  const source = path.join(root, 'src', 'app', 'page.tsx');
  writeFileSync(source, 'export {};');
  utimesSync(source, times.source, times.source);
  utimesSync(path.join(root, 'src', 'app'), times.source, times.source);
  utimesSync(path.join(root, 'src'), times.source, times.source);
  if (times.build !== undefined) {
    mkdirSync(path.join(root, 'dist'));
    const built = path.join(root, 'dist', 'index.html');
    writeFileSync(built, '<!doctype html>');
    utimesSync(built, times.build, times.build);
  }
}

describe('whether the browser build is current', () => {
  it('is not when there is no build', () => {
    project({ source: 1_000_000 });
    expect(browserBuildIsCurrent(root)).toBe(false);
  });

  it('is when the build is newer than every source', () => {
    project({ source: 1_000_000, build: 2_000_000 });
    expect(browserBuildIsCurrent(root)).toBe(true);
  });

  it('is not when a source file deep in src/ changed after the build', () => {
    project({ source: 3_000_000, build: 2_000_000 });
    expect(browserBuildIsCurrent(root)).toBe(false);
  });

  it('is not when index.html changed after the build', () => {
    project({ source: 1_000_000, build: 2_000_000 });
    writeFileSync(path.join(root, 'index.html'), '<!doctype html>');
    utimesSync(path.join(root, 'index.html'), 3_000_000, 3_000_000);
    expect(browserBuildIsCurrent(root)).toBe(false);
  });
});
