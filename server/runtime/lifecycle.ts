/**
 * Whether this process is stopping. While it drains, /api/ready answers 503 (a load balancer
 * stops sending it work), long-lived streams are ended (tablets reconnect to another process)
 * and responses ask clients to close their kept-alive connection.
 */
export interface Lifecycle {
  readonly draining: boolean;
  /** Runs `stop` when draining begins (at once if it already has); returns an unsubscribe. */
  onDrain(stop: () => void): () => void;
  startDrain(): void;
}

export function createLifecycle(): Lifecycle {
  let draining = false;
  const listeners = new Set<() => void>();
  return {
    get draining() {
      return draining;
    },
    onDrain(stop) {
      if (draining) {
        stop();
        return () => undefined;
      }
      listeners.add(stop);
      return () => listeners.delete(stop);
    },
    startDrain() {
      if (draining) return;
      draining = true;
      for (const stop of [...listeners]) stop();
      listeners.clear();
    },
  };
}
