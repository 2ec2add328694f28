// `npm run build`, second half: compiles the server, its migrations and the migrate command
// to JavaScript in dist/server, so production runs on Node alone (no tsx, no Vite). Run after
// `vite build`, which empties dist/. Packages stay external: they come from node_modules.
import { readdirSync, rmSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { build } from 'esbuild';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');

const common = {
  platform: 'node',
  format: 'esm',
  target: 'node20',
  bundle: true,
  packages: 'external',
  sourcemap: true,
  logLevel: 'warning',
};

export async function buildServer(projectRoot = root) {
  const out = path.join(projectRoot, 'dist', 'server');
  rmSync(out, { recursive: true, force: true });
  await build({
    ...common,
    absWorkingDir: projectRoot,
    entryPoints: { main: 'server/main.ts', migrate: 'server/migrate.ts' },
    outdir: out,
  });
  // One file per migration, named as its source: Kysely records migrations by file name.
  const migrations = readdirSync(path.join(projectRoot, 'migrations'))
    .filter((file) => file.endsWith('.ts'))
    .map((file) => path.join('migrations', file));
  await build({
    ...common,
    absWorkingDir: projectRoot,
    entryPoints: migrations,
    outdir: path.join(out, 'migrations'),
    sourcemap: false,
  });
  return out;
}

if (process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url)) {
  const out = await buildServer();
  process.stdout.write(`Built the server into ${path.relative(root, out)}/\n`);
}
