import { execFileSync, spawnSync } from 'node:child_process';
import { existsSync, mkdirSync, readdirSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import pg from 'pg';

/**
 * A private PostgreSQL cluster from Debian's packages, run on loopback.
 * PostgreSQL refuses to run as root, so as root every server command runs as the
 * `postgres` system user, which must be able to enter every parent folder of the data.
 */

const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;
const CLUSTER_OWNER = 'postgres';
export const CLUSTER_SUPERUSER = 'app';

export function findPostgresBinaries(): string | null {
  const base = '/usr/lib/postgresql';
  if (!existsSync(base)) return null;
  const versions = readdirSync(base)
    .filter((name) => existsSync(path.join(base, name, 'bin', 'initdb')))
    .sort((a, b) => Number(b) - Number(a));
  return versions[0] ? path.join(base, versions[0], 'bin') : null;
}

export function ensurePostgresInstalled(log: (line: string) => void): string {
  const found = findPostgresBinaries();
  if (found) return found;
  const command = 'apt-get update && apt-get install -y postgresql';
  if (!isRoot) {
    throw new Error(
      `PostgreSQL is not installed. Install it with:\n  sudo sh -c '${command}'\nor set DATABASE_URL to an existing server.`,
    );
  }
  log('PostgreSQL is missing: installing the Debian package (about a minute)...');
  const result = spawnSync('sh', ['-c', command], {
    stdio: 'inherit',
    env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
  });
  const installed = findPostgresBinaries();
  if (result.status !== 0 || !installed) throw new Error(`"${command}" failed.`);
  return installed;
}

function runAsOwner(command: string, args: string[]): { status: number | null; output: string } {
  const [file, fullArgs] = isRoot
    ? ['runuser', ['-u', CLUSTER_OWNER, '--', command, ...args]]
    : [command, args];
  const result = spawnSync(file, fullArgs, { cwd: '/', encoding: 'utf8' });
  return { status: result.status, output: `${result.stdout ?? ''}${result.stderr ?? ''}` };
}

function ownerCanEnter(folder: string): boolean {
  if (!isRoot) return true;
  return runAsOwner('test', ['-x', folder, '-a', '-r', folder]).status === 0;
}

/** The data folder to use: the preferred one, or a fallback the cluster owner can reach. */
export function chooseDataFolder(preferred: string, fallback: string): string {
  const absolute = path.resolve(preferred);
  if (!isRoot) return absolute;
  mkdirSync(path.dirname(absolute), { recursive: true });
  if (ownerCanEnter(path.dirname(absolute))) return absolute;
  mkdirSync(path.dirname(fallback), { recursive: true });
  return fallback;
}

export function freePort(): Promise<number> {
  return new Promise((resolve, reject) => {
    const server = net.createServer();
    server.unref();
    server.on('error', reject);
    server.listen(0, '127.0.0.1', () => {
      const address = server.address();
      server.close(() => resolve(typeof address === 'object' && address ? address.port : 0));
    });
  });
}

export interface ClusterOptions {
  dataFolder: string;
  port: number;
  /** Throw-away clusters for tests trade durability for speed. */
  disposable?: boolean;
  /** More server settings (`name=value`), e.g. pg_stat_statements for the benchmarks. */
  settings?: string[];
  log?: (line: string) => void;
}

export interface RunningCluster {
  port: number;
  dataFolder: string;
  /** True when this process started the server, or took it over, and so must stop it. */
  startedHere: boolean;
  /** True when the server was left running by a process that is gone, and this one took it over. */
  takenOver: boolean;
  /** When another live process runs the server: its pid (it stays running after this one stops). */
  ownedBy: number | null;
  urlFor(database: string): string;
  stop(): void;
}

export async function startCluster(options: ClusterOptions): Promise<RunningCluster> {
  const log = options.log ?? (() => undefined);
  const bin = ensurePostgresInstalled(log);
  const { dataFolder, port } = options;
  const pgCtl = path.join(bin, 'pg_ctl');

  if (!existsSync(path.join(dataFolder, 'PG_VERSION'))) {
    mkdirSync(dataFolder, { recursive: true, mode: 0o700 });
    if (isRoot) execFileSync('chown', ['-R', `${CLUSTER_OWNER}:`, dataFolder]);
    log(`Creating a PostgreSQL cluster in ${dataFolder}`);
    const init = runAsOwner(path.join(bin, 'initdb'), [
      '-D',
      dataFolder,
      '-U',
      CLUSTER_SUPERUSER,
      '--auth=trust',
      '--encoding=UTF8',
      '--locale=C.UTF-8',
    ]);
    if (init.status !== 0) throw new Error(`initdb failed:\n${init.output}`);
  }

  const urlFor = (database: string) =>
    `postgres://${CLUSTER_SUPERUSER}@127.0.0.1:${port}/${database}`;

  const stopServer = () => {
    runAsOwner(pgCtl, ['-D', dataFolder, '-m', 'fast', '-w', 'stop']);
    forgetOwner(dataFolder);
  };

  if (runAsOwner(pgCtl, ['-D', dataFolder, 'status']).status === 0) {
    const running = readPostmasterFile(dataFolder);
    const owner = readOwner(dataFolder);
    const runningUrl = (database: string) =>
      `postgres://${CLUSTER_SUPERUSER}@127.0.0.1:${running.port}/${database}`;
    if (owner !== null && owner !== process.pid && isAlive(owner)) {
      log(
        `PostgreSQL is already running on ${dataFolder}, started by another Likeness process ` +
          `(pid ${owner}); using it. It keeps running when this process stops.`,
      );
      return {
        port: running.port,
        dataFolder,
        startedHere: false,
        takenOver: false,
        ownedBy: owner,
        urlFor: runningUrl,
        stop: () => undefined,
      };
    }
    // The process that started it was killed without stopping it (kill -9, a crash): this
    // process becomes its owner, so Ctrl-C really stops it.
    log(
      `PostgreSQL was left running on ${dataFolder} (server pid ${running.pid}) by a process ` +
        'that is gone; taking it over. It will be stopped when this process stops.',
    );
    writeOwner(dataFolder);
    let stoppedTakenOver = false;
    return {
      port: running.port,
      dataFolder,
      startedHere: true,
      takenOver: true,
      ownedBy: null,
      urlFor: runningUrl,
      stop() {
        if (stoppedTakenOver) return;
        stoppedTakenOver = true;
        stopServer();
      },
    };
  }

  const settings = [
    `-p ${port}`,
    `-c listen_addresses=127.0.0.1`,
    `-c unix_socket_directories=${dataFolder}`,
    ...(options.disposable
      ? [
          '-c fsync=off',
          '-c synchronous_commit=off',
          '-c full_page_writes=off',
          '-c max_connections=300',
        ]
      : []),
    ...(options.settings ?? []).map((setting) => `-c ${setting}`),
  ].join(' ');
  const start = runAsOwner(pgCtl, [
    '-D',
    dataFolder,
    '-l',
    path.join(dataFolder, 'server.log'),
    '-o',
    settings,
    '-w',
    '-t',
    '60',
    'start',
  ]);
  if (start.status !== 0) {
    throw new Error(
      `PostgreSQL did not start (see ${path.join(dataFolder, 'server.log')}):\n${start.output}`,
    );
  }
  writeOwner(dataFolder);
  let stopped = false;
  return {
    port,
    dataFolder,
    startedHere: true,
    takenOver: false,
    ownedBy: null,
    urlFor,
    stop() {
      if (stopped) return;
      stopped = true;
      stopServer();
    },
  };
}

/** postmaster.pid: line 1 the server's pid, line 4 its port (PostgreSQL's documented layout). */
function readPostmasterFile(dataFolder: string): { pid: number; port: number } {
  const lines = readFileSync(path.join(dataFolder, 'postmaster.pid'), 'utf8').split('\n');
  return { pid: Number(lines[0]), port: Number(lines[3]) };
}

/** Beside the data folder: the pid of the process that started (and will stop) the server. */
export function ownerFileOf(dataFolder: string): string {
  return `${path.resolve(dataFolder)}.owner.json`;
}

function readOwner(dataFolder: string): number | null {
  try {
    const parsed: unknown = JSON.parse(readFileSync(ownerFileOf(dataFolder), 'utf8'));
    const pid = (parsed as { pid?: unknown }).pid;
    return typeof pid === 'number' && Number.isInteger(pid) && pid > 0 ? pid : null;
  } catch {
    return null;
  }
}

function writeOwner(dataFolder: string) {
  writeFileSync(ownerFileOf(dataFolder), JSON.stringify({ pid: process.pid }));
}

function forgetOwner(dataFolder: string) {
  if (readOwner(dataFolder) === process.pid) rmSync(ownerFileOf(dataFolder), { force: true });
}

function isAlive(pid: number): boolean {
  try {
    process.kill(pid, 0);
    return true;
  } catch (error) {
    // EPERM: the process exists but belongs to someone else.
    return (error as NodeJS.ErrnoException).code === 'EPERM';
  }
}

export async function ensureDatabase(cluster: RunningCluster, name: string): Promise<string> {
  const client = new pg.Client({ connectionString: cluster.urlFor('postgres') });
  await client.connect();
  try {
    const found = await client.query('select 1 from pg_database where datname = $1', [name]);
    if (found.rowCount === 0) await client.query(`create database "${name}"`);
  } finally {
    await client.end();
  }
  return cluster.urlFor(name);
}
