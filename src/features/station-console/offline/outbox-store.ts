import type { ConsoleSnapshot } from '../../../../server/schemas/console';
import type { OutboxItem } from '../model/outbox-item';

/**
 * The tablet's own store (IndexedDB): changes waiting to be sent, and the last snapshot of each
 * day so the console opens without network. Survives reloads and a browser restart.
 */
const databaseName = 'likeness-station-console';
const outbox = 'outbox';
const snapshots = 'snapshots';

let opening: Promise<IDBDatabase> | undefined;

function open(): Promise<IDBDatabase> {
  opening ??= new Promise((resolve, reject) => {
    const request = indexedDB.open(databaseName, 1);
    request.onupgradeneeded = () => {
      const database = request.result;
      database.createObjectStore(outbox, { keyPath: 'action.idempotencyKey' });
      database.createObjectStore(snapshots, { keyPath: 'day.id' });
    };
    request.onsuccess = () => resolve(request.result);
    request.onerror = () => reject(request.error ?? new Error('IndexedDB could not open.'));
  });
  return opening;
}

async function run<T>(
  store: string,
  mode: IDBTransactionMode,
  work: (objects: IDBObjectStore) => IDBRequest<T> | undefined,
): Promise<T | undefined> {
  const database = await open();
  return new Promise((resolve, reject) => {
    const transaction = database.transaction(store, mode);
    const request = work(transaction.objectStore(store));
    // Resolve on commit, not on the request: only then is the change really on disk.
    transaction.oncomplete = () => resolve(request?.result);
    transaction.onerror = () => reject(transaction.error ?? new Error('IndexedDB write failed.'));
    transaction.onabort = () => reject(transaction.error ?? new Error('IndexedDB write aborted.'));
  });
}

export const outboxStore = {
  async add(item: OutboxItem): Promise<void> {
    await run(outbox, 'readwrite', (objects) => objects.put(item));
  },
  async remove(idempotencyKey: string): Promise<void> {
    await run(outbox, 'readwrite', (objects) => objects.delete(idempotencyKey));
  },
  async list(): Promise<OutboxItem[]> {
    const items = (await run(outbox, 'readonly', (objects) => objects.getAll())) as
      OutboxItem[] | undefined;
    return (items ?? []).sort((a, b) => a.sequence - b.sequence);
  },
};

export const snapshotStore = {
  async save(snapshot: ConsoleSnapshot): Promise<void> {
    await run(snapshots, 'readwrite', (objects) => objects.put(snapshot));
  },
  async load(dayId: string): Promise<ConsoleSnapshot | undefined> {
    return (await run(snapshots, 'readonly', (objects) => objects.get(dayId))) as
      ConsoleSnapshot | undefined;
  },
};
