import { spawn, type ChildProcessWithoutNullStreams } from 'node:child_process';

/** A Likeness process started from the build (`node dist/server/main.js` or `npm run serve`). */
export interface BuiltProcess {
  output(): string;
  /** Resolves once the output matches, with a helpful failure showing what it said. */
  waitFor(pattern: RegExp, timeoutMs?: number): Promise<void>;
  /** Sends the signal and resolves with the exit code. */
  stop(signal?: NodeJS.Signals): Promise<number | null>;
  kill(): void;
}

export function startBuiltProcess(options: {
  cwd: string;
  command: string;
  args: string[];
  env: Record<string, string>;
}): BuiltProcess {
  // Only what the process is given: no test runner settings leak into "production".
  const child: ChildProcessWithoutNullStreams = spawn(options.command, options.args, {
    cwd: options.cwd,
    env: { PATH: process.env.PATH ?? '', HOME: process.env.HOME ?? '/tmp', ...options.env },
  });
  let text = '';
  child.stdout.on('data', (chunk: Buffer) => (text += chunk.toString()));
  child.stderr.on('data', (chunk: Buffer) => (text += chunk.toString()));
  const exited = new Promise<number | null>((resolve) => child.once('exit', resolve));
  return {
    output: () => text,
    async waitFor(pattern, timeoutMs = 60_000) {
      await pollUntil(
        () => pattern.test(text),
        timeoutMs,
        () => `no ${pattern} in:\n${text}`,
      );
    },
    async stop(signal = 'SIGTERM') {
      if (child.exitCode === null) child.kill(signal);
      return exited;
    },
    kill() {
      if (child.exitCode === null) child.kill('SIGKILL');
    },
  };
}

/** Polls a URL until it answers 200 (a process is ready once /api/ready says so). */
export async function waitUntilReady(baseUrl: string, timeoutMs = 60_000) {
  await pollUntil(
    async () => (await fetch(`${baseUrl}/api/ready`).catch(() => null))?.status === 200,
    timeoutMs,
    () => `${baseUrl}/api/ready did not answer 200`,
  );
}

// Plain polling rather than expect.poll: these also run in beforeAll, outside any test.
async function pollUntil(
  check: () => boolean | Promise<boolean>,
  timeoutMs: number,
  failure: () => string,
) {
  const deadline = Date.now() + timeoutMs;
  while (!(await check())) {
    if (Date.now() > deadline) throw new Error(failure());
    await new Promise((resolve) => setTimeout(resolve, 200));
  }
}
