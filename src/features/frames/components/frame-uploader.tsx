import { useQueryClient } from '@tanstack/react-query';
import { useEffect, useMemo, useRef, useState, useSyncExternalStore, type DragEvent } from 'react';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { filesFromDrop, filesFromInput, type CardFile } from '../upload/card-files';
import { UploadQueue, type FileState } from '../upload/upload-queue';
import { formatBytes, formatDuration } from './upload-figures';

const stateLabels: Record<FileState, string> = {
  waiting: 'Waiting',
  checking: 'Checking',
  sending: 'Sending',
  paused: 'Paused',
  offline: 'Waiting for the network',
  stored: 'Stored',
  duplicate: 'Already here',
  refused: 'Refused',
  failed: 'Failed',
};

const SHOWN_ROWS = 200;

/** Choose a station, drop a card's DCIM folder or files, and watch them go up. */
export function FrameUploader({
  dayId,
  stations,
}: {
  dayId: string;
  stations: Array<{ stationId: string; stationName: string }>;
}) {
  const queryClient = useQueryClient();
  const [stationId, setStationId] = useState(stations[0]?.stationId ?? '');
  const [dragging, setDragging] = useState(false);
  const folderInput = useRef<HTMLInputElement>(null);
  const queue = useMemo(
    () =>
      new UploadQueue(dayId, {
        onFileDone: () =>
          void queryClient.invalidateQueries({ queryKey: ['days', dayId, 'frames'] }),
      }),
    [dayId, queryClient],
  );
  const snapshot = useSyncExternalStore(queue.subscribe, queue.getSnapshot);

  useEffect(() => {
    const back = () => queue.networkReturned();
    window.addEventListener('online', back);
    return () => window.removeEventListener('online', back);
  }, [queue]);

  useEffect(() => {
    // webkitdirectory is not in React's attribute list: set it on the element itself.
    folderInput.current?.setAttribute('webkitdirectory', '');
  }, []);

  const add = (files: CardFile[]) => {
    if (stationId) queue.add(files, stationId);
  };
  const onDrop = async (event: DragEvent) => {
    event.preventDefault();
    setDragging(false);
    add(await filesFromDrop(event.dataTransfer.items));
  };

  const active = snapshot.counts.waiting + snapshot.counts.checking + snapshot.counts.sending;
  const percent =
    snapshot.totalBytes > 0 ? Math.floor((snapshot.sentBytes / snapshot.totalBytes) * 100) : 0;
  const problems = snapshot.files.filter(
    (item) => item.state === 'refused' || item.state === 'failed',
  );
  const rows = [
    ...problems,
    ...snapshot.files.filter((item) => item.state !== 'refused' && item.state !== 'failed'),
  ].slice(0, SHOWN_ROWS);

  return (
    <div className="flex flex-col gap-4">
      <div className="max-w-sm">
        <SelectField
          label="Station these frames come from"
          value={stationId}
          onChange={setStationId}
          options={stations.map((station) => ({
            value: station.stationId,
            label: station.stationName,
          }))}
        />
      </div>
      <div
        onDragOver={(event) => {
          event.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={(event) => void onDrop(event)}
        className={`flex flex-col items-center gap-3 rounded-card border-2 border-dashed px-6 py-8 text-center ${dragging ? 'border-spruce-600 bg-spruce-50' : 'border-line-strong bg-paper-sunk'}`}
      >
        <p className="font-medium">Drop the card’s DCIM folder or some frames here</p>
        <p className="text-sm text-ink-muted">
          JPEG, HEIF and raw files. Each file’s path on the card is kept; a file already uploaded is
          recognised and kept once.
        </p>
        <div className="flex flex-wrap justify-center gap-3">
          <label className="inline-flex min-h-touch cursor-pointer items-center rounded-control bg-spruce-600 px-4 font-medium text-paper-raised focus-within:outline-2">
            Choose a folder
            <input
              ref={folderInput}
              type="file"
              multiple
              className="sr-only"
              onChange={(event) => {
                if (event.target.files) add(filesFromInput(event.target.files));
                event.target.value = '';
              }}
            />
          </label>
          <label className="inline-flex min-h-touch cursor-pointer items-center rounded-control border border-line-strong bg-paper-raised px-4 font-medium text-spruce-700 focus-within:outline-2">
            Choose files
            <input
              type="file"
              multiple
              className="sr-only"
              data-testid="frame-files"
              onChange={(event) => {
                if (event.target.files) add(filesFromInput(event.target.files));
                event.target.value = '';
              }}
            />
          </label>
        </div>
      </div>

      {snapshot.files.length > 0 ? (
        <div className="flex flex-col gap-3">
          <div>
            <div className="flex flex-wrap items-baseline justify-between gap-2">
              <p role="status" className="font-medium">
                {formatBytes(snapshot.sentBytes)} of {formatBytes(snapshot.totalBytes)} sent (
                {percent} %)
                {' · '}
                {snapshot.counts.stored + snapshot.counts.duplicate} of {snapshot.files.length}{' '}
                files done
              </p>
              <p className="text-sm text-ink-muted">
                {snapshot.bytesPerSecond > 0 ? `${formatBytes(snapshot.bytesPerSecond)}/s` : ''}
                {snapshot.secondsLeft !== null
                  ? ` · about ${formatDuration(snapshot.secondsLeft)} left`
                  : ''}
              </p>
            </div>
            <progress
              className="mt-2 h-3 w-full"
              max={100}
              value={percent}
              aria-label="Upload progress"
            />
          </div>
          {snapshot.counts.offline > 0 ? (
            <Notice tone="caution">
              The connection dropped. Uploads resume by themselves when the network returns.
            </Notice>
          ) : null}
          <div className="flex flex-wrap gap-2">
            {snapshot.paused ? (
              <Button onClick={() => queue.resume()}>Resume uploads</Button>
            ) : (
              <Button variant="secondary" onClick={() => queue.pause()} disabled={active === 0}>
                Pause uploads
              </Button>
            )}
            {snapshot.counts.failed > 0 && !snapshot.paused ? (
              <Button variant="secondary" onClick={() => queue.resume()}>
                Try failed files again
              </Button>
            ) : null}
            <Button variant="quiet" onClick={() => queue.clearFinished()}>
              Clear finished files from the list
            </Button>
          </div>
          <ul
            className="flex max-h-96 flex-col divide-y divide-line overflow-y-auto rounded-control border border-line"
            aria-label="Files"
          >
            {rows.map((item) => (
              <li
                key={item.key}
                className="flex flex-wrap items-center gap-x-3 gap-y-1 px-3 py-2 text-sm"
              >
                <span className="min-w-0 flex-1 truncate font-mono">{item.cardPath}</span>
                <span className="text-ink-muted">{formatBytes(item.file.size)}</span>
                <span
                  className={
                    item.state === 'refused' || item.state === 'failed'
                      ? 'font-medium text-danger-700'
                      : item.state === 'stored' || item.state === 'duplicate'
                        ? 'text-success-600'
                        : 'text-ink-muted'
                  }
                >
                  {stateLabels[item.state]}
                  {item.state === 'sending'
                    ? ` ${Math.floor((item.sent / Math.max(1, item.file.size)) * 100)} %`
                    : ''}
                </span>
                {item.message ? (
                  <span className="basis-full text-ink-muted">{item.message}</span>
                ) : null}
              </li>
            ))}
          </ul>
          {snapshot.files.length > SHOWN_ROWS ? (
            <p className="text-sm text-ink-muted">
              Showing problems first and {SHOWN_ROWS} of {snapshot.files.length} files.
            </p>
          ) : null}
        </div>
      ) : null}
    </div>
  );
}
