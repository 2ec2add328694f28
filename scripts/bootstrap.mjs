// Entry point of `npm start`, `npm run dev`, `npm test`, `npm run bench`, and of the production
// commands `npm run serve` and `npm run migrate`.
// Plain JavaScript on purpose: it must run on a fresh clone before anything is installed, and in
// a production install (`npm ci --omit=dev`), which has neither tsx nor the TypeScript sources' tools.
import { spawnSync } from 'node:child_process';
import { existsSync, statSync } from 'node:fs';
import path from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';

const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const command = process.argv[2] ?? 'start';
const entries = {
  start: 'scripts/start.ts',
  dev: 'scripts/start.ts',
  test: 'scripts/test.ts',
  bench: 'bench/run.ts',
  migrate: 'server/migrate.ts',
};
// Production commands run the build (`npm run build`) with production dependencies only.
const built = {
  serve: 'dist/server/main.js',
  migrate: 'dist/server/migrate.js',
};

function log(line) {
  process.stdout.write(`[likeness] ${line}\n`);
}

function dependenciesNeedInstall() {
  const installed = path.join(root, 'node_modules', '.package-lock.json');
  if (!existsSync(installed)) return 'node_modules is missing';
  const lock = path.join(root, 'package-lock.json');
  if (existsSync(lock) && statSync(lock).mtimeMs > statSync(installed).mtimeMs + 1000) {
    return 'package-lock.json is newer than node_modules';
  }
  return null;
}

function hasTsx() {
  return existsSync(path.join(root, 'node_modules', 'tsx', 'package.json'));
}

// `migrate` runs the sources where the development tools are installed, the build elsewhere.
if (command === 'serve' || (command === 'migrate' && !hasTsx())) {
  const file = path.join(root, built[command]);
  if (!existsSync(path.join(root, 'node_modules'))) {
    log('node_modules is missing: run `npm ci --omit=dev` (production) or `npm ci` first.');
    process.exit(2);
  }
  if (!existsSync(file)) {
    log(
      `${built[command]} is missing: run \`npm run build\` (with the development dependencies) first.`,
    );
    process.exit(2);
  }
  process.argv.splice(2, 1);
  await import(pathToFileURL(file).href);
} else {
  await runWithTsx();
}

async function runWithTsx() {
  const reason = dependenciesNeedInstall();
  if (reason) {
    const fresh = !existsSync(path.join(root, 'node_modules'));
    const args = fresh && existsSync(path.join(root, 'package-lock.json')) ? ['ci'] : ['install'];
    log(`${reason}: running npm ${args.join(' ')} (a minute or two the first time)...`);
    const result = spawnSync('npm', [...args, '--no-audit', '--no-fund'], {
      cwd: root,
      stdio: 'inherit',
    });
    if (result.status !== 0) {
      log(`npm ${args[0]} failed; see the messages above.`);
      process.exit(result.status ?? 1);
    }
  }

  const entry = entries[command];
  if (!entry) {
    log(`unknown command "${command}"; use one of ${Object.keys(entries).join(', ')}`);
    process.exit(2);
  }

  process.env.LIKENESS_MODE = command;
  // The entry sees only the arguments meant for it (`npm run bench -- roster` -> ["roster"]).
  process.argv.splice(2, 1);
  const { register } = await import('tsx/esm/api');
  register();
  await import(pathToFileURL(path.join(root, entry)).href);
}
