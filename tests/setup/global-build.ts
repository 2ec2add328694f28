import { existsSync } from 'node:fs';
import path from 'node:path';
import { build } from 'vite';
import { buildServer } from '../../scripts/build-server.mjs';

/**
 * Browser and production tests run against the build (browser app and compiled server);
 * `npm test` builds first and says so.
 */
export default async function setup() {
  const root = path.resolve(import.meta.dirname, '../..');
  const built = ['index.html', 'server/main.js'].every((file) =>
    existsSync(path.join(root, 'dist', file)),
  );
  if (process.env.LIKENESS_TEST_BUILT === '1' && built) return;
  await build({ root, logLevel: 'warn' });
  await buildServer(root);
}
