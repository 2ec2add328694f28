import type { ConsoleAction } from '../../../../server/schemas/console';

/** One change recorded on the tablet, waiting for (or being sent to) the server. */
export interface OutboxItem {
  action: ConsoleAction;
  dayId: string;
  /** What the photographer did, in words, for the waiting list and error messages. */
  label: string;
  /** The name to show for someone the snapshot does not know yet (walk-ins). */
  personName?: string;
  /** SHA-256 of a scanned pass token, to find the sitter in the snapshot while offline. */
  passHash?: string;
  /** For an undo: the change it takes back, so the console can show the result before sending. */
  target?: ConsoleAction;
  /** Order of recording; changes are sent strictly in this order. */
  sequence: number;
  /**
   * The server refused it (or kept failing on it): kept on the tablet and shown, but no longer
   * sent, so the changes behind it still go out. Sending it again clears this.
   */
  setAside?: { reason: string; at: string };
}
