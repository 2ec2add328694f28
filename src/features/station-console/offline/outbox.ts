import type { ConsoleActionResult } from '../../../../server/schemas/console';
import { ApiError } from '../../../lib/api-client';
import type { OutboxItem } from '../model/outbox-item';
import { outboxStore } from './outbox-store';

export interface OutboxNotice {
  id: string;
  tone: 'success' | 'danger';
  text: string;
  /** A refused last frame: the console offers to correct the first frame and finish. */
  fix?: { sittingId: string; lastFrame: number };
}

export interface OutboxState {
  /**
   * Recorded on the tablet; `sent` ones wait only for the next snapshot to show them; set-aside
   * ones were refused and wait for the photographer to send them again or discard them.
   */
  items: Array<OutboxItem & { sent?: boolean }>;
  /** False once a send failed for want of network, until one succeeds again. */
  reachable: boolean;
  /** The session ended: changes stay on the tablet until someone signs in again. */
  signedOut: boolean;
  notices: OutboxNotice[];
}

type Send = (item: OutboxItem) => Promise<ConsoleActionResult>;

/** How long a notice stays before it fades; one that offers a fix stays until replaced. */
const noticeMs = { success: 5000, danger: 10000 };
/** Server errors (5xx) on one change before it is set aside so the rest can go out. */
const serverFailuresBeforeSetAside = 3;
/** Answers that mean "not now" rather than "never": the change is kept in line and retried. */
const retryLater = new Set([0, 408, 425, 429]);

/**
 * The tablet's queue of changes. Each is written to IndexedDB before anything else happens,
 * then sent strictly in order; a network failure stops the line and retries later. A change the
 * server refuses (4xx), or keeps failing on (5xx), is set aside: kept on the tablet and listed
 * for the photographer, while the changes behind it keep going out.
 */
export class Outbox {
  private state: OutboxState = { items: [], reachable: true, signedOut: false, notices: [] };
  private listeners = new Set<() => void>();
  private flushing = false;
  private retry: ReturnType<typeof setTimeout> | undefined;
  private inFlight: string | null = null;
  private counter = 0;
  private serverFailures = new Map<string, number>();
  private fadeTimer: ReturnType<typeof setTimeout> | undefined;

  constructor(
    private readonly dayId: string,
    private readonly send: Send,
    /** Refetches the snapshot; resolves once the screen shows the server's truth. */
    private readonly refresh: () => Promise<void>,
  ) {}

  subscribe = (listener: () => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  getState = () => this.state;

  private set(patch: Partial<OutboxState>) {
    this.state = { ...this.state, ...patch };
    for (const listener of this.listeners) listener();
  }

  /** A message from the console itself (read on the tablet, never sent). */
  note(tone: OutboxNotice['tone'], text: string) {
    this.notify(tone, text);
  }

  /**
   * One notice at a time: a new one replaces the last and fades on its own. A notice that
   * offers a fix (correct the first frame) stays until used or dismissed.
   */
  private notify(tone: OutboxNotice['tone'], text: string, fix?: OutboxNotice['fix']) {
    const notice: OutboxNotice = { id: crypto.randomUUID(), tone, text, ...(fix ? { fix } : {}) };
    clearTimeout(this.fadeTimer);
    const offers = this.state.notices.filter((item) => item.fix).slice(-2);
    this.set({ notices: [...offers, notice] });
    if (!fix) this.fadeTimer = setTimeout(() => this.dismiss(notice.id), noticeMs[tone]);
  }

  dismiss(id: string) {
    this.set({ notices: this.state.notices.filter((notice) => notice.id !== id) });
  }

  async load() {
    const stored = await outboxStore.list();
    this.set({ items: stored.filter((item) => item.dayId === this.dayId) });
    void this.flush();
  }

  /** Records a change. Resolves once it is safely on the tablet, before it is sent. */
  async submit(item: Omit<OutboxItem, 'sequence' | 'dayId'>) {
    const full: OutboxItem = {
      ...item,
      dayId: this.dayId,
      sequence: Date.now() * 1000 + (this.counter++ % 1000),
    };
    await outboxStore.add(full);
    this.set({ items: [...this.state.items, full] });
    void this.flush();
  }

  /** Takes back a change that has not left the tablet. False when it is already sent. */
  async withdraw(idempotencyKey: string): Promise<boolean> {
    const item = this.state.items.find((entry) => entry.action.idempotencyKey === idempotencyKey);
    if (!item || item.sent || this.inFlight === idempotencyKey) return false;
    await outboxStore.remove(idempotencyKey);
    this.set({ items: this.state.items.filter((entry) => entry !== item) });
    return true;
  }

  /** The next snapshot arrived: sent changes are now part of it. */
  snapshotArrived() {
    if (this.state.items.some((item) => item.sent)) {
      this.set({ items: this.state.items.filter((item) => !item.sent) });
    }
  }

  waitingCount() {
    return this.state.items.filter((item) => !item.sent && !item.setAside).length;
  }

  /** A set-aside change goes to the back of the line and is sent again. */
  async sendAgain(idempotencyKey: string) {
    const item = this.state.items.find((entry) => entry.action.idempotencyKey === idempotencyKey);
    if (!item?.setAside) return;
    const { setAside: _cleared, ...rest } = item;
    const again: OutboxItem = { ...rest, sequence: Date.now() * 1000 + (this.counter++ % 1000) };
    await outboxStore.add(again);
    this.serverFailures.delete(idempotencyKey);
    this.set({
      items: [...this.state.items.filter((entry) => entry !== item), again],
    });
    void this.flush();
  }

  /** The photographer gives up on a set-aside change: it leaves the tablet. */
  async discard(idempotencyKey: string) {
    const item = this.state.items.find((entry) => entry.action.idempotencyKey === idempotencyKey);
    if (!item?.setAside) return;
    await outboxStore.remove(idempotencyKey);
    this.set({ items: this.state.items.filter((entry) => entry !== item) });
  }

  private async setAside(item: OutboxItem, reason: string) {
    const aside: OutboxItem = { ...item, setAside: { reason, at: new Date().toISOString() } };
    // Kept on the tablet (a reload still lists it), never sent again on its own.
    await outboxStore.add(aside);
    this.serverFailures.delete(item.action.idempotencyKey);
    this.set({
      items: this.state.items.map((entry) => (entry === item ? aside : entry)),
    });
  }

  async flush(): Promise<void> {
    if (this.flushing) return;
    this.flushing = true;
    clearTimeout(this.retry);
    try {
      for (;;) {
        const next = this.state.items.find((item) => !item.sent && !item.setAside);
        if (!next) break;
        this.inFlight = next.action.idempotencyKey;
        try {
          const result = await this.send(next);
          await outboxStore.remove(next.action.idempotencyKey);
          this.serverFailures.delete(next.action.idempotencyKey);
          this.mark(next, 'sent');
          this.set({ reachable: true, signedOut: false });
          if (!result.replayed) this.notify('success', result.message);
        } catch (error) {
          if (error instanceof ApiError && error.status === 401) {
            // Never drop work because a session expired: keep it for the next sign-in.
            this.set({ signedOut: true });
            break;
          }
          const key = next.action.idempotencyKey;
          const status = error instanceof ApiError ? error.status : 0;
          const failures = status >= 500 ? (this.serverFailures.get(key) ?? 0) + 1 : 0;
          if (status >= 500) this.serverFailures.set(key, failures);
          if (
            retryLater.has(status) ||
            (status >= 500 && failures < serverFailuresBeforeSetAside)
          ) {
            // No network, or the server is busy or in trouble: keep everything, try again soon.
            this.set({ reachable: status !== 0 && status < 500 });
            this.retry = setTimeout(() => void this.flush(), 3000);
            break;
          }
          const message =
            status >= 500
              ? `the server could not save it (error ${status}).`
              : (error as ApiError).message;
          const { action } = next;
          const fix =
            error instanceof ApiError &&
            error.code === 'implausible_last_frame' &&
            action.kind === 'finish_sitting' &&
            action.lastFrame !== null
              ? { sittingId: action.sittingId, lastFrame: action.lastFrame }
              : undefined;
          if (fix) {
            // Put right from the notice (correct the first frame), not sent again as it was.
            await outboxStore.remove(key);
            this.mark(next, 'refused');
          } else {
            await this.setAside(next, message);
          }
          this.notify('danger', `Not saved — ${next.label}: ${message}`, fix);
        } finally {
          this.inFlight = null;
        }
        await this.refresh().then(
          () => this.snapshotArrived(),
          () => undefined,
        );
      }
    } finally {
      this.flushing = false;
    }
  }

  private mark(item: OutboxItem, outcome: 'sent' | 'refused') {
    this.set({
      items:
        outcome === 'sent'
          ? this.state.items.map((entry) => (entry === item ? { ...entry, sent: true } : entry))
          : this.state.items.filter((entry) => entry !== item),
    });
  }

  stop() {
    clearTimeout(this.retry);
  }
}
