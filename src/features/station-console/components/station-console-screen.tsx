import { useEffect, useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import { expectedNextFrame } from '../../../../server/schemas/console-rules';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { useConsoleSnapshot } from '../api/get-console-snapshot';
import { useConsoleEvents } from '../live/use-console-events';
import { useWakeLock } from '../live/use-wake-lock';
import { applyPending, type ShownEntry, type ShownSitting } from '../model/apply-pending';
import { correctableSittings } from '../model/correctable-sittings';
import { neighbourFlashHolds } from '../model/neighbour-flash-holds';
import { useBrowserOnline, useOutbox } from '../offline/use-outbox';
import { CheckInPanel } from './check-in-panel';
import { CorrectFrames } from './correct-frames';
import { FinishSitting } from './finish-sitting';
import { Notices } from './notices';
import { QueueEntryCard } from './queue-entry';
import { SetAsideList } from './set-aside-list';
import { Slate } from './slate';
import { StationFrames } from './station-frames';
import { SyncIndicator } from './sync-indicator';
import { UndoBar } from './undo-bar';
import { useConsoleCommands } from './use-console-commands';

/** The console of one station on one day, for a tablet held in one hand. */
export function StationConsoleScreen({
  dayId,
  stationId,
  onSignOut,
}: {
  dayId: string;
  stationId: string;
  onSignOut: () => void;
}) {
  const snapshot = useConsoleSnapshot(dayId);
  const { outbox, state } = useOutbox(dayId);
  const browserOnline = useBrowserOnline();
  useConsoleEvents(dayId, stationId);
  useWakeLock();
  const [now, setNow] = useState(() => new Date());
  const [checkingIn, setCheckingIn] = useState(false);
  const [slate, setSlate] = useState<{ entry: ShownEntry; token: string } | null>(null);
  const [finishing, setFinishing] = useState<{
    entry: ShownEntry;
    sitting: ShownSitting;
    refusedLastFrame?: number;
  } | null>(null);
  const [correcting, setCorrecting] = useState<{ name: string; sittingId: string } | null>(null);
  const [scope, setScope] = useState<'station' | 'all'>('station');
  useEffect(() => {
    // Re-read the clock so no-show buttons appear when their grace period ends.
    const timer = setInterval(() => setNow(new Date()), 15_000);
    return () => clearInterval(timer);
  }, []);

  const data = snapshot.data;
  // A set-aside change will not happen unless sent again: the screen does not show it as done.
  const pending = useMemo(() => state.items.filter((item) => !item.setAside), [state.items]);
  const setAside = useMemo(() => state.items.filter((item) => item.setAside), [state.items]);
  const shown = useMemo(
    () => applyPending(data ?? { entries: [], sittings: [] }, pending),
    [data, pending],
  );
  const commands = useConsoleCommands(outbox, stationId, shown);
  // A stored copy is shown only when the server could not be reached: that is offline too, even
  // where the browser still believes it has a network (a venue's Wi-Fi without a way out).
  const online = browserOnline && state.reachable && !data?.fromTablet;
  const waiting = pending.filter((item) => !item.sent).length;

  if (snapshot.isPending) return <p className="p-6 text-xl">Loading the console…</p>;
  if (!data) {
    return (
      <div className="p-6">
        <Notice tone="danger">{snapshot.error?.message ?? 'The console could not load.'}</Notice>
      </div>
    );
  }
  const station = data.stations.find((item) => item.id === stationId);
  if (!station) {
    return (
      <div className="flex flex-col gap-4 p-6">
        <Notice tone="danger">This station is not part of the day any more.</Notice>
        <Link className="text-lg text-spruce-700 underline" to="/console">
          Choose a station
        </Link>
      </div>
    );
  }
  const stationName = (id: string | null) =>
    data.stations.find((item) => item.id === id)?.name ?? null;
  const timeOf = (iso: string) =>
    new Intl.DateTimeFormat('en-GB', {
      timeZone: data.day.timeZone,
      hour: '2-digit',
      minute: '2-digit',
    }).format(new Date(iso));
  const openSittingOf = (entry: ShownEntry) =>
    shown.sittings.find((item) => item.personId === entry.personId && item.finishedAt === null);
  const entries = shown.entries.filter(
    (entry) =>
      scope === 'all' ||
      entry.stationId === stationId ||
      entry.checkIn?.stationId === stationId ||
      openSittingOf(entry)?.stationId === stationId,
  );
  // Who steps up next: someone already waiting, else the earliest booking still to come.
  const next =
    entries.find((entry) => entry.status === 'arrived') ??
    entries.find((entry) => entry.status === 'booked');
  const nameOf = (sitting: ShownSitting) =>
    shown.entries.find((entry) => entry.personId === sitting.personId)?.name ?? 'The sitter';
  const { inChair, lastFinished } = correctableSittings(shown.sittings, stationId);
  // Looked up on every render, so the dialog follows the sitting as changes are applied.
  const correctingSitting = correcting
    ? shown.sittings.find((sitting) => sitting.id === correcting.sittingId)
    : undefined;
  const fixRefusedFinish = (noticeId: string, fix: { sittingId: string; lastFrame: number }) => {
    const sitting = shown.sittings.find((item) => item.id === fix.sittingId);
    const entry = sitting && shown.entries.find((item) => item.personId === sitting.personId);
    if (!sitting || !entry) return;
    outbox.dismiss(noticeId);
    if (sitting.finishedAt === null) {
      setFinishing({ entry, sitting, refusedLastFrame: fix.lastFrame });
    } else {
      setCorrecting({ name: entry.name, sittingId: sitting.id });
    }
  };
  const flashCount = entries.filter(
    (entry) => entry.flashSensitive && ['booked', 'arrived', 'in_chair'].includes(entry.status),
  ).length;
  const holdFor = neighbourFlashHolds({ stations: data.stations, ...shown }, stationId);

  return (
    <div className="flex min-h-dvh flex-col">
      <header className="flex flex-wrap items-center gap-3 border-b border-line bg-paper-raised px-4 py-2">
        <div className="flex flex-col">
          <h1 className="text-2xl font-bold">{station.name}</h1>
          <p className="text-sm text-ink-muted">
            {data.day.clientName} · {data.day.officeName} · {data.day.date}
          </p>
        </div>
        <div className="flex-1" />
        <SyncIndicator
          waiting={waiting}
          online={online}
          fromTablet={data.fromTablet}
          signedOut={state.signedOut}
        />
        {data.canAct ? (
          <Button onClick={() => setCheckingIn((open) => !open)} aria-expanded={checkingIn}>
            Check in
          </Button>
        ) : null}
        <Link
          to="/console"
          className="inline-flex min-h-touch items-center rounded-control px-3 font-medium text-spruce-700 underline"
        >
          Change station
        </Link>
        <Button
          variant="secondary"
          onClick={() => {
            // Waiting changes stay on the tablet and go out after the next sign-in.
            const message = `${waiting} ${waiting === 1 ? 'change has' : 'changes have'} not reached the server yet. They stay on this tablet and are sent after the next sign-in. Sign out anyway?`;
            if (waiting === 0 || window.confirm(message)) onSignOut();
          }}
        >
          Sign out
        </Button>
      </header>
      <main className="flex flex-1 flex-wrap gap-4 p-4">
        <section aria-label="Queue" className="flex min-w-80 flex-1 flex-col gap-3">
          <SetAsideList
            items={setAside}
            onSendAgain={(key) => void outbox.sendAgain(key)}
            onDiscard={(key) => void outbox.discard(key)}
          />
          {!data.canAct ? (
            <Notice>You can follow the console; only the studio can change it.</Notice>
          ) : null}
          {holdFor.length > 0 ? (
            <Notice tone="danger">
              Hold your flashes: {holdFor.join(' and ')} {holdFor.length === 1 ? 'has' : 'have'} a
              sitter in the chair who must not see flash (same room). Continuous light only until
              they finish.
            </Notice>
          ) : null}
          {flashCount > 0 ? (
            <Notice tone="danger">
              {flashCount} flash-sensitive {flashCount === 1 ? 'sitter is' : 'sitters are'} still to
              come: use continuous light and single exposures for them.
            </Notice>
          ) : null}
          <StationFrames
            inChair={inChair}
            lastFinished={lastFinished}
            nameOf={nameOf}
            canAct={data.canAct}
            onCorrect={(sitting) => setCorrecting({ name: nameOf(sitting), sittingId: sitting.id })}
          />
          <div role="group" aria-label="Show" className="flex gap-2">
            {(['station', 'all'] as const).map((value) => (
              <button
                key={value}
                type="button"
                aria-pressed={scope === value}
                onClick={() => setScope(value)}
                className={`min-h-touch rounded-control border px-4 text-base font-semibold ${
                  scope === value
                    ? 'border-spruce-600 bg-spruce-600 text-paper-raised'
                    : 'border-line-strong bg-paper-raised text-spruce-700'
                }`}
              >
                {value === 'station' ? 'This station' : 'All stations'}
              </button>
            ))}
          </div>
          {entries.length === 0 ? (
            <p className="text-lg text-ink-muted">
              Nobody booked here yet. Walk-ins can be checked in with “Check in”.
            </p>
          ) : null}
          <ol aria-label="Sitters" className="flex flex-col gap-2">
            {entries.map((entry) => (
              <QueueEntryCard
                key={entry.key}
                entry={entry}
                isNext={entry === next}
                openSitting={openSittingOf(entry)}
                stationName={scope === 'all' ? stationName(entry.stationId) : null}
                timeOf={timeOf}
                now={now}
                graceMinutes={data.day.graceMinutes}
                canAct={data.canAct}
                actions={{
                  checkIn: (item) => commands.checkIn(item),
                  startSitting: (item) =>
                    setSlate({ entry: item, token: commands.newSlateToken() }),
                  finishSitting: (item, sitting) => setFinishing({ entry: item, sitting }),
                  markNoShow: (item) => commands.markNoShow(item),
                }}
              />
            ))}
          </ol>
        </section>
        {checkingIn && data.canAct ? (
          <div className="w-full max-w-md">
            <CheckInPanel
              dayId={dayId}
              online={online}
              onPass={(text) => void commands.checkInPass(text)}
              onPerson={(person) => commands.checkInPerson(person)}
              onNewPerson={(input) => commands.checkInNewPerson(input)}
              onClose={() => setCheckingIn(false)}
            />
          </div>
        ) : null}
      </main>
      {slate ? (
        <Slate
          name={slate.entry.name}
          slateToken={slate.token}
          flashSensitive={slate.entry.flashSensitive}
          expectedFrame={expectedNextFrame(
            shown.sittings.filter((sitting) => sitting.stationId === stationId),
          )}
          onStart={(firstFrame) => {
            commands.startSitting(slate.entry, slate.token, firstFrame);
            setSlate(null);
          }}
          onCancel={() => setSlate(null)}
        />
      ) : null}
      {finishing ? (
        <FinishSitting
          name={finishing.entry.name}
          firstFrame={finishing.sitting.firstFrame}
          typedFirstFrame={finishing.sitting.typedFirstFrame}
          refusedLastFrame={finishing.refusedLastFrame}
          onFinish={(lastFrame) => {
            commands.finishSitting(finishing.entry, finishing.sitting, lastFrame);
            setFinishing(null);
          }}
          onCorrectFirstAndFinish={(firstFrame, lastFrame) => {
            void commands.correctFirstAndFinish(
              finishing.entry,
              finishing.sitting,
              firstFrame,
              lastFrame,
            );
            setFinishing(null);
          }}
          onCancel={() => setFinishing(null)}
        />
      ) : null}
      {correcting && correctingSitting ? (
        <CorrectFrames
          name={correcting.name}
          sitting={correctingSitting}
          onSave={(correction) => {
            commands.correctFrames(correcting.name, correctingSitting, correction);
            setCorrecting(null);
          }}
          onCancel={() => setCorrecting(null)}
        />
      ) : null}
      <Notices
        notices={state.notices}
        onDismiss={(id) => outbox.dismiss(id)}
        onFix={fixRefusedFinish}
      />
      {commands.undo ? (
        <UndoBar label={commands.undo.label} onUndo={() => void commands.takeBack()} />
      ) : null}
    </div>
  );
}
