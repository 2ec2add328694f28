import { existsSync, readdirSync, statSync } from 'node:fs';
import path from 'node:path';

/** What the browser build is made from: a change to any of these makes dist/ out of date. */
const BUILD_INPUTS = ['src', 'public', 'index.html', 'vite.config.ts', 'tailwind.config.ts'];
/** What the compiled server in dist/server is made from. */
const SERVER_INPUTS = ['server', 'migrations', 'scripts/build-server.mjs'];

function newestChange(target: string): number {
  if (!existsSync(target)) return 0;
  const info = statSync(target);
  if (!info.isDirectory()) return info.mtimeMs;
  let newest = info.mtimeMs;
  for (const entry of readdirSync(target)) {
    newest = Math.max(newest, newestChange(path.join(target, entry)));
  }
  return newest;
}

/**
 * True when dist/ holds a build newer than every source it is made from, so `npm start` can
 * serve it as it is (and a production install without Vite can start at all).
 */
export function browserBuildIsCurrent(root: string): boolean {
  return isNewerThanAll(path.join(root, 'dist', 'index.html'), root, BUILD_INPUTS);
}

/** True when dist/server (what `npm run serve` runs) is newer than the server's sources. */
export function serverBuildIsCurrent(root: string): boolean {
  return isNewerThanAll(path.join(root, 'dist', 'server', 'main.js'), root, SERVER_INPUTS);
}

function isNewerThanAll(built: string, root: string, inputs: string[]): boolean {
  if (!existsSync(built)) return false;
  const builtAt = statSync(built).mtimeMs;
  return inputs.every((input) => newestChange(path.join(root, input)) <= builtAt);
}
