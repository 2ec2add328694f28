import type { Server } from 'node:http';
import type { Lifecycle } from './lifecycle';

/**
 * Stops a server the way a load balancer expects: no new connections, requests already being
 * answered finish (an upload's last bytes, a commit), idle kept-alive connections close, and
 * only what is still open after `timeoutMs` is cut.
 */
export function drainHttpServer(
  server: Server,
  lifecycle: Lifecycle,
  timeoutMs: number,
): Promise<'drained' | 'timed out'> {
  lifecycle.startDrain();
  return new Promise((resolve) => {
    let settled = false;
    const finish = (outcome: 'drained' | 'timed out') => {
      if (settled) return;
      settled = true;
      clearInterval(sweeper);
      clearTimeout(deadline);
      resolve(outcome);
    };
    server.close(() => finish('drained'));
    server.closeIdleConnections();
    // A connection that finishes its request becomes idle: close it as soon as it does.
    const sweeper = setInterval(() => server.closeIdleConnections(), 100);
    const deadline = setTimeout(() => {
      server.closeAllConnections();
      finish('timed out');
    }, timeoutMs);
    sweeper.unref();
    deadline.unref();
  });
}
