import { readdirSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { startTestCluster } from '../tests/setup/postgres-cluster';

/**
 * `npm run bench`: runs every bench/*.bench.ts against one throw-away PostgreSQL cluster.
 * Each benchmark prints JSON lines with its own figures and a baseline measured in the same run.
 * `npm run bench -- roster` runs only the benchmarks whose file name contains "roster".
 */
export interface BenchContext {
  /** Connection URL of the cluster's maintenance database; benchmarks create their own. */
  adminUrl: string;
  print(figures: Record<string, unknown>): void;
}

export interface Benchmark {
  name: string;
  run(context: BenchContext): Promise<void>;
}

const folder = path.dirname(fileURLToPath(import.meta.url));
const filter = process.argv.slice(2).find((arg) => !arg.startsWith('-'));
const files = readdirSync(folder)
  .filter((file) => file.endsWith('.bench.ts'))
  .filter((file) => !filter || file.includes(filter))
  .sort();

// pg_stat_statements lets a benchmark say where its database time goes (CREATE EXTENSION in
// its own database, then read the view).
const cluster = await startTestCluster({
  settings: [
    'shared_preload_libraries=pg_stat_statements',
    'pg_stat_statements.track=all',
    'pg_stat_statements.track_planning=on',
  ],
});
let failures = 0;
try {
  if (files.length === 0) process.stdout.write('No benchmarks matched.\n');
  for (const file of files) {
    const module = (await import(pathToFileURL(path.join(folder, file)).href)) as {
      default: Benchmark;
    };
    try {
      await module.default.run({
        adminUrl: cluster.adminUrl,
        print: (figures) => process.stdout.write(`${JSON.stringify(figures)}\n`),
      });
    } catch (error) {
      failures += 1;
      process.stdout.write(
        `${JSON.stringify({ bench: module.default.name, error: String(error) })}\n`,
      );
    }
  }
} finally {
  cluster.stop();
}
process.exit(failures === 0 ? 0 : 1);
