import type { TestProject } from 'vitest/node';
import { startTestCluster } from './postgres-cluster';

declare module 'vitest' {
  export interface ProvidedContext {
    pgAdminUrl: string;
  }
}

/**
 * Uses the cluster `npm test` started (LIKENESS_TEST_PG_URL), or starts its own when a single
 * file is run with `npx vitest run path/to/file`.
 */
export default async function setup(project: TestProject) {
  const shared = process.env.LIKENESS_TEST_PG_URL;
  if (shared) {
    project.provide('pgAdminUrl', shared);
    return undefined;
  }
  const cluster = await startTestCluster();
  project.provide('pgAdminUrl', cluster.adminUrl);
  return () => cluster.stop();
}
