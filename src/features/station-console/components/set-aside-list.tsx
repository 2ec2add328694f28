import { Button } from '../../../components/ui/button';
import type { OutboxItem } from '../model/outbox-item';

/**
 * Changes the server refused, kept on the tablet so none is lost silently. The changes
 * recorded after them went out regardless; each one here can be sent again or discarded.
 */
export function SetAsideList({
  items,
  onSendAgain,
  onDiscard,
}: {
  items: OutboxItem[];
  onSendAgain: (idempotencyKey: string) => void;
  onDiscard: (idempotencyKey: string) => void;
}) {
  if (items.length === 0) return null;
  return (
    <section
      aria-label="Changes set aside"
      className="flex flex-col gap-2 rounded-card border-l-4 border-danger-600 bg-danger-50 p-3"
    >
      <h2 className="text-lg font-semibold text-danger-700">
        {items.length === 1 ? '1 change was' : `${items.length} changes were`} not saved
      </h2>
      <p className="text-base">
        The server refused {items.length === 1 ? 'it' : 'them'}; everything after went on. Check,
        then send again or discard.
      </p>
      <ul className="flex flex-col gap-2">
        {items.map((item) => (
          <li
            key={item.action.idempotencyKey}
            className="flex flex-wrap items-center gap-3 rounded-control bg-paper-raised px-3 py-2"
          >
            <p className="flex-1 text-base">
              <span className="font-semibold">{item.label}</span>: {item.setAside?.reason}
            </p>
            <Button variant="secondary" onClick={() => onSendAgain(item.action.idempotencyKey)}>
              Send again
            </Button>
            <Button variant="quiet" onClick={() => onDiscard(item.action.idempotencyKey)}>
              Discard
            </Button>
          </li>
        ))}
      </ul>
    </section>
  );
}
