import { spawn, type ChildProcessWithoutNullStreams } from 'node:child_process';
import { expect } from 'vitest';

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
      await expect.poll(() => text, { timeout: timeoutMs, interval: 200 }).toMatch(pattern);
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
  await expect
    .poll(
      async () => {
        try {
          return (await fetch(`${baseUrl}/api/ready`)).status;
        } catch {
          return 0;
        }
      },
      { timeout: timeoutMs, interval: 250 },
    )
    .toBe(200);
}
