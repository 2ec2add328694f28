import { useRef, useState } from 'react';
import type { ConsoleAction } from '../../../../server/schemas/console';
import type { ShownConsole, ShownEntry, ShownSitting } from '../model/apply-pending';
import { newId, newSlateToken, sha256Hex } from '../model/ids';
import type { OutboxItem } from '../model/outbox-item';
import type { Outbox } from '../offline/outbox';
import type { FrameCorrection } from './correct-frames';
import type { NewPersonInput } from './new-person-form';

type Body = ConsoleAction extends infer A
  ? A extends ConsoleAction
    ? Omit<A, 'idempotencyKey' | 'stationId' | 'tabletAt'>
    : never
  : never;

const samePassMs = 5000;

/** Every change the console can make, each recorded through the outbox with its own key. */
export function useConsoleCommands(outbox: Outbox, stationId: string, shown: ShownConsole) {
  const [undo, setUndo] = useState<{ key: string; label: string; target: ConsoleAction } | null>(
    null,
  );

  // The same pass shown again within a few seconds is one scan (one check-in, one notice).
  const lastPass = useRef({ token: '', at: 0 });

  async function record(
    body: Body,
    label: string,
    extra: Pick<OutboxItem, 'personName' | 'passHash' | 'target'> = {},
    // A correction is put right by correcting again, so it offers no undo.
    undoable = true,
  ) {
    const action = {
      ...body,
      idempotencyKey: newId(),
      stationId,
      tabletAt: new Date().toISOString(),
    } as ConsoleAction;
    try {
      await outbox.submit({ action, label, ...extra });
    } catch {
      outbox.note('danger', `Not saved — ${label}: this tablet could not store the change.`);
      return;
    }
    // Undo stays offered until the next change: the photographer's hands may be full.
    if (action.kind === 'undo' || !undoable) {
      setUndo(null);
      return;
    }
    setUndo({ key: action.idempotencyKey, label, target: action });
  }

  return {
    undo,
    async takeBack() {
      if (!undo) return;
      setUndo(null);
      if (await outbox.withdraw(undo.key)) {
        outbox.note('success', `Taken back: ${undo.label}.`);
        return;
      }
      await record({ kind: 'undo', targetKey: undo.key }, `undo ${undo.label}`, {
        target: undo.target,
      });
    },
    checkIn(entry: ShownEntry) {
      void record(
        { kind: 'check_in_person', checkInId: newId(), personId: entry.personId },
        `check in ${entry.name}`,
      );
    },
    checkInPerson(person: { id: string; name: string }) {
      void record(
        { kind: 'check_in_person', checkInId: newId(), personId: person.id },
        `check in ${person.name}`,
        { personName: person.name },
      );
    },
    checkInNewPerson(input: NewPersonInput) {
      const name = `${input.givenName} ${input.familyName}`;
      void record(
        { kind: 'check_in_new_person', checkInId: newId(), personId: newId(), ...input },
        `add ${name}`,
        { personName: name },
      );
    },
    async checkInPass(text: string) {
      const passToken = text.trim().toUpperCase();
      const now = Date.now();
      const repeat = lastPass.current.token === passToken && now - lastPass.current.at < samePassMs;
      lastPass.current = { token: passToken, at: now };
      if (repeat) return;
      // crypto.subtle exists only on https (and localhost); without it the server decides alone.
      const passHash = crypto.subtle ? await sha256Hex(passToken) : undefined;
      const known = passHash ? shown.entries.find((entry) => entry.passHash === passHash) : null;
      if (known && known.checkIn) {
        outbox.note('danger', `${known.name} is already checked in.`);
        return;
      }
      await record(
        { kind: 'check_in_pass', checkInId: newId(), passToken },
        `check in ${known?.name ?? 'scanned pass'}`,
        { passHash },
      );
    },
    startSitting(entry: ShownEntry, slateToken: string, firstFrame: number) {
      if (!entry.checkIn) return;
      void record(
        {
          kind: 'start_sitting',
          sittingId: newId(),
          checkInId: entry.checkIn.id,
          slateToken,
          firstFrame,
        },
        `start the sitting of ${entry.name}`,
      );
    },
    finishSitting(entry: ShownEntry, sitting: ShownSitting, lastFrame: number | null) {
      void record(
        { kind: 'finish_sitting', sittingId: sitting.id, lastFrame },
        `finish the sitting of ${entry.name}`,
      );
    },
    correctFrames(name: string, sitting: ShownSitting, correction: FrameCorrection) {
      void record(
        { kind: 'correct_frames', sittingId: sitting.id, ...correction },
        `correct the frame numbers of ${name}`,
        {},
        false,
      );
    },
    async correctFirstAndFinish(
      entry: ShownEntry,
      sitting: ShownSitting,
      firstFrame: number,
      lastFrame: number,
    ) {
      // Recorded one after the other, so the outbox sends the correction first.
      await record(
        { kind: 'correct_frames', sittingId: sitting.id, firstFrame },
        `correct the first frame of ${entry.name}`,
        {},
        false,
      );
      await record(
        { kind: 'finish_sitting', sittingId: sitting.id, lastFrame },
        `finish the sitting of ${entry.name}`,
      );
    },
    markNoShow(entry: ShownEntry) {
      if (!entry.bookingId) return;
      void record(
        { kind: 'mark_no_show', noShowId: newId(), bookingId: entry.bookingId },
        `mark ${entry.name} no-show`,
      );
    },
    newSlateToken,
  };
}
