import type { Logger } from '../lib/logger';

export type Cleanup = () => Promise<void> | void;

/**
 * The steps a process undoes when it stops, run in reverse order of being added (the web
 * server drains before the worker stops, the worker finishes its jobs before the pool closes).
 * SIGINT and SIGTERM both stop gracefully; a second signal does not start a second shutdown.
 */
export function createShutdown(say: (line: string) => void, logger: Logger) {
  const cleanups: Cleanup[] = [];
  let stopping = false;
  async function shutDown(reason: string, code = 0) {
    if (stopping) return;
    stopping = true;
    say(`${reason}: shutting down...`);
    for (const cleanup of cleanups.reverse()) {
      try {
        await cleanup();
      } catch (error) {
        logger.error({ err: error }, 'cleanup step failed');
      }
    }
    say('stopped cleanly.');
    process.exit(code);
  }
  process.on('SIGINT', () => void shutDown('SIGINT'));
  process.on('SIGTERM', () => void shutDown('SIGTERM'));
  return {
    add: (cleanup: Cleanup) => void cleanups.push(cleanup),
    shutDown,
  };
}
