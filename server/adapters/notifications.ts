import pg from 'pg';

/** The channel services NOTIFY on, with the day id as payload. */
export const consoleChannel = 'station_console';

/**
 * Day-change notifications for the live console. Services NOTIFY inside their transaction;
 * this adapter LISTENs on one dedicated connection per app process and fans the day ids out to
 * subscribers, so every process behind a load balancer hears every change.
 */
export interface Notifications {
  subscribe(dayId: string, listener: () => void): () => void;
  close(): Promise<void>;
}

type Listener = () => void;

export async function createPgNotifications(
  connectionString: string,
  onError: (error: unknown) => void = () => undefined,
): Promise<Notifications> {
  const listeners = new Map<string, Set<Listener>>();
  let client: pg.Client | null = null;
  let closed = false;
  let retry: NodeJS.Timeout | undefined;

  const deliver = (dayId: string) => {
    for (const listener of listeners.get(dayId) ?? []) listener();
  };

  async function connect() {
    const next = new pg.Client({ connectionString });
    next.on('notification', (message) => {
      if (message.channel === consoleChannel && message.payload) deliver(message.payload);
    });
    // A dropped connection is re-made; tablets also refetch when their stream reconnects.
    next.on('error', (error) => {
      onError(error);
      client = null;
      if (!closed) retry = setTimeout(() => void connect().catch(onError), 1000);
    });
    await next.connect();
    await next.query(`listen ${consoleChannel}`);
    client = next;
  }
  await connect();

  return {
    subscribe(dayId, listener) {
      let set = listeners.get(dayId);
      if (!set) listeners.set(dayId, (set = new Set()));
      set.add(listener);
      return () => {
        set.delete(listener);
        if (set.size === 0) listeners.delete(dayId);
      };
    },
    async close() {
      closed = true;
      clearTimeout(retry);
      listeners.clear();
      await client?.end();
    },
  };
}
