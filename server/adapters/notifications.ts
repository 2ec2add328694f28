import pg from 'pg';

/** The channel services NOTIFY on, with the day id as payload. */
export const consoleChannel = 'station_console';

/** `changed`: one day changed. `refresh`: notifications may have been missed; reload everything. */
export type DayEvent = 'changed' | 'refresh';

export interface ListenerStatus {
  state: 'listening' | 'reconnecting';
  /** How many times the connection was lost and made again since the process started. */
  reconnects: number;
  /** Attempts that failed since the connection was last up (0 while listening). */
  failedAttempts: number;
}

/**
 * Day-change notifications for the live console. Services NOTIFY inside their transaction;
 * this adapter LISTENs on one dedicated connection per app process and fans the day ids out to
 * subscribers, so every process behind a load balancer hears every change.
 */
export interface Notifications {
  subscribe(dayId: string, listener: (event: DayEvent) => void): () => void;
  status(): ListenerStatus;
  close(): Promise<void>;
}

type Listener = (event: DayEvent) => void;

export interface ReconnectOptions {
  /** The first wait after a lost connection; it doubles on each failed attempt. */
  firstDelayMs?: number;
  /** The longest wait between attempts: the listener keeps trying for as long as it takes. */
  maxDelayMs?: number;
}

export async function createPgNotifications(
  connectionString: string,
  onError: (error: unknown) => void = () => undefined,
  options: ReconnectOptions = {},
): Promise<Notifications> {
  const firstDelayMs = options.firstDelayMs ?? 250;
  const maxDelayMs = options.maxDelayMs ?? 10_000;
  const listeners = new Map<string, Set<Listener>>();
  let client: pg.Client | null = null;
  let closed = false;
  let retry: NodeJS.Timeout | undefined;
  let failedAttempts = 0;
  let reconnects = 0;
  let everConnected = false;

  const deliver = (dayId: string, event: DayEvent) => {
    for (const listener of listeners.get(dayId) ?? []) listener(event);
  };

  function scheduleRetry() {
    if (closed || retry) return;
    const delay = Math.min(maxDelayMs, firstDelayMs * 2 ** Math.min(failedAttempts, 16));
    failedAttempts += 1;
    retry = setTimeout(() => {
      retry = undefined;
      void connect();
    }, delay);
  }

  async function connect(): Promise<void> {
    const next = new pg.Client({ connectionString });
    let lost = false;
    // 'error' and 'end' may both fire for one drop (or fire during connect): handle it once.
    const onLost = (error?: unknown) => {
      if (error) onError(error);
      if (lost) return;
      lost = true;
      if (client === next) client = null;
      next.removeAllListeners('notification');
      scheduleRetry();
    };
    next.on('notification', (message) => {
      if (message.channel === consoleChannel && message.payload) {
        deliver(message.payload, 'changed');
      }
    });
    next.on('error', onLost);
    next.on('end', () => onLost());
    try {
      await next.connect();
      await next.query(`listen ${consoleChannel}`);
    } catch (error) {
      onLost(error);
      void next.end().catch(() => undefined);
      return;
    }
    if (closed || lost) {
      await next.end().catch(() => undefined);
      return;
    }
    client = next;
    failedAttempts = 0;
    if (everConnected) {
      reconnects += 1;
      // Changes made while the connection was down were never heard: every open stream reloads.
      for (const dayId of [...listeners.keys()]) deliver(dayId, 'refresh');
    }
    everConnected = true;
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
    status: () => ({ state: client ? 'listening' : 'reconnecting', reconnects, failedAttempts }),
    async close() {
      closed = true;
      clearTimeout(retry);
      listeners.clear();
      const current = client;
      client = null;
      await current?.end().catch(() => undefined);
    },
  };
}
