import { existsSync } from 'node:fs';
import path from 'node:path';
import { build } from 'vite';

/** Browser tests run against the built app; `npm test` builds first and says so. */
export default async function setup() {
  const root = path.resolve(import.meta.dirname, '../..');
  if (process.env.LIKENESS_TEST_BUILT === '1' && existsSync(path.join(root, 'dist', 'index.html')))
    return;
  await build({ root, logLevel: 'warn' });
}
