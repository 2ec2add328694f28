import { spawn, spawnSync } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, rmSync } from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { ensurePostgresInstalled } from './lib/postgres-cluster';
import { startTestCluster } from '../tests/setup/postgres-cluster';

/**
 * `npm test`: installs what is missing, then typecheck, lint, format check, build, and every
 * vitest project (unit, client, server, e2e) against one throw-away PostgreSQL cluster.
 * Ends with one summary line: "summary: N passed, N failed".
 */
const root = path.resolve(path.dirname(fileURLToPath(import.meta.url)), '..');
const isRoot = process.getuid?.() === 0;
const say = (line: string) => process.stdout.write(`[likeness test] ${line}\n`);
const extraArgs = process.argv.slice(2);

/**
 * Debian packages the tests use: Chromium (browser tests), exiftool (an independent EXIF
 * reader), Info-ZIP unzip (an independent ZIP reader).
 */
const neededPackages = [
  { file: '/usr/bin/chromium', name: 'chromium' },
  { file: '/usr/bin/exiftool', name: 'libimage-exiftool-perl' },
  { file: '/usr/bin/unzip', name: 'unzip' },
  // The invoice test reads its PDF back with poppler's pdftotext and pdffonts.
  { file: '/usr/bin/pdftotext', name: 'poppler-utils' },
];

function ensureDebianPackages() {
  const missing = neededPackages.filter((entry) => !existsSync(entry.file));
  if (missing.length === 0) return;
  const names = missing.map((entry) => entry.name).join(' ');
  if (!isRoot) {
    throw new Error(
      `Missing: ${names}. Install with: sudo apt-get update && sudo apt-get install -y ${names}`,
    );
  }
  say(`Installing Debian packages the tests need: ${names} (about a minute)...`);
  const result = spawnSync('sh', ['-c', `apt-get update && apt-get install -y ${names}`], {
    stdio: 'inherit',
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
  });
  if (result.status !== 0 || missing.some((entry) => !existsSync(entry.file)))
    throw new Error(`Installing ${names} failed.`);
}

function run(
  label: string,
  command: string,
  args: string[],
  env: NodeJS.ProcessEnv = process.env,
): Promise<boolean> {
  say(`${label}...`);
  return new Promise((resolve) => {
    const child = spawn(command, args, { cwd: root, stdio: 'inherit', env });
    child.on('exit', (code) => {
      say(`${label}: ${code === 0 ? 'ok' : `failed (exit ${code})`}`);
      resolve(code === 0);
    });
  });
}

const bin = (name: string) => path.join(root, 'node_modules', '.bin', name);

async function main() {
  ensurePostgresInstalled(say);
  ensureDebianPackages();

  const failedSteps: string[] = [];
  if (!(await run('typecheck', bin('tsc'), ['--noEmit', '-p', 'tsconfig.json'])))
    failedSteps.push('typecheck');
  if (!(await run('lint', bin('eslint'), ['.', '--max-warnings=0']))) failedSteps.push('lint');
  if (!(await run('format check', bin('prettier'), ['--check', '.', '--log-level', 'warn'])))
    failedSteps.push('format');
  const built =
    (await run('build', bin('vite'), ['build', '--logLevel', 'warn'])) &&
    (await run('server build', process.execPath, ['scripts/build-server.mjs']));
  if (!built) failedSteps.push('build');

  say('starting a throw-away PostgreSQL for the tests...');
  const cluster = await startTestCluster();
  const reportFolder = mkdtempSync(path.join(os.tmpdir(), 'likeness-report-'));
  const reportFile = path.join(reportFolder, 'vitest.json');
  let passed = 0;
  let failed = 0;
  let skipped = 0;
  try {
    const testsOk = await run(
      'tests',
      bin('vitest'),
      [
        'run',
        '--reporter=default',
        '--reporter=json',
        `--outputFile.json=${reportFile}`,
        ...extraArgs,
      ],
      {
        ...process.env,
        LIKENESS_TEST_PG_URL: cluster.adminUrl,
        LIKENESS_TEST_BUILT: failedSteps.includes('build') ? '0' : '1',
      },
    );
    if (existsSync(reportFile)) {
      const report = JSON.parse(readFileSync(reportFile, 'utf8')) as {
        numPassedTests: number;
        numFailedTests: number;
        numPendingTests: number;
        numTodoTests: number;
        testResults: Array<{ status: string; assertionResults: Array<{ status: string }> }>;
      };
      passed = report.numPassedTests;
      // A file that failed outside any test (an import error, a failing hook) counts once.
      const brokenFiles = report.testResults.filter(
        (file) =>
          file.status === 'failed' &&
          !file.assertionResults.some((test) => test.status === 'failed'),
      ).length;
      failed = report.numFailedTests + brokenFiles;
      skipped = report.numPendingTests + report.numTodoTests;
    }
    if (!testsOk && failed === 0) failed = 1;
  } finally {
    cluster.stop();
    rmSync(reportFolder, { recursive: true, force: true });
  }

  // Checks that are not tests still fail the run, and count as failures in the summary.
  failed += failedSteps.length;
  if (failedSteps.length > 0) say(`failed steps: ${failedSteps.join(', ')}`);
  if (skipped > 0) say(`${skipped} skipped tests: no test may be skipped`);
  process.stdout.write(
    `summary: ${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ''}\n`,
  );
  process.exit(failed === 0 && skipped === 0 ? 0 : 1);
}

main().catch((error: unknown) => {
  say(error instanceof Error ? error.message : String(error));
  process.stdout.write('summary: 0 passed, 1 failed\n');
  process.exit(1);
});
