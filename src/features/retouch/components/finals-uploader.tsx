import { useQueryClient } from '@tanstack/react-query';
import { useMemo, useState, useSyncExternalStore } from 'react';
import type { RetouchRow } from '../../../../server/schemas/proofs';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { UploadQueue } from '../../frames/upload/upload-queue';
import { allPicks } from '../api/retouch';
import { matchFinals } from '../model/match-finals';

interface Pending {
  file: File;
  pickId: string;
  by: 'name' | 'number' | 'hand' | null;
  ambiguous: boolean;
}

const byWords = { name: 'matched by name', number: 'matched by number', hand: 'chosen by hand' };

/**
 * Drop the retouched files: each is matched to its pick by the original's name or number;
 * anything unmatched waits for a choice. They go up over the same resumable upload as frames.
 */
export function FinalsUploader({ dayId }: { dayId: string }) {
  const queryClient = useQueryClient();
  const queue = useMemo(
    () =>
      new UploadQueue(dayId, {
        onFileDone: () =>
          void queryClient.invalidateQueries({ queryKey: ['days', dayId, 'retouch'] }),
      }),
    [dayId, queryClient],
  );
  const snapshot = useSyncExternalStore(queue.subscribe, queue.getSnapshot);
  const [picks, setPicks] = useState<RetouchRow[]>([]);
  const [pending, setPending] = useState<Pending[]>([]);

  const choose = async (files: File[]) => {
    const rows = await allPicks(dayId);
    setPicks(rows);
    const matches = matchFinals(
      files.map((file) => file.name),
      rows.map((row) => ({ pickId: row.pickId, fileName: row.fileName })),
    );
    setPending(
      files.map((file, index) => ({
        file,
        pickId: matches[index]!.pickId ?? '',
        by: matches[index]!.by,
        ambiguous: matches[index]!.ambiguous,
      })),
    );
  };
  const ready = pending.filter((entry) => entry.pickId);
  const send = () => {
    queue.addFinals(
      ready.map((entry) => ({ file: entry.file, cardPath: entry.file.name, pickId: entry.pickId })),
    );
    setPending(pending.filter((entry) => !entry.pickId));
  };

  return (
    <div className="flex flex-col gap-3">
      <label className="inline-flex min-h-touch w-fit cursor-pointer items-center rounded-control bg-spruce-600 px-4 font-medium text-paper-raised focus-within:outline-2">
        Choose retouched files
        <input
          type="file"
          multiple
          accept="image/jpeg,image/tiff,image/heif,.jpg,.jpeg,.tif,.tiff,.heic,.heif"
          className="sr-only"
          data-testid="final-files"
          onChange={(event) => {
            if (event.target.files) void choose(Array.from(event.target.files));
            event.target.value = '';
          }}
        />
      </label>
      {pending.length > 0 ? (
        <>
          <ul className="flex flex-col gap-2" aria-label="Retouched files to send">
            {pending.map((entry, index) => (
              <li key={`${entry.file.name}-${index}`} className="flex flex-wrap items-center gap-3">
                <span className="font-mono">{entry.file.name}</span>
                <label className="flex items-center gap-2 text-sm">
                  <span className="sr-only">Pick for {entry.file.name}</span>
                  <select
                    className="min-h-touch rounded-control border border-line-strong bg-paper-raised px-2"
                    value={entry.pickId}
                    onChange={(event) =>
                      setPending((current) =>
                        current.map((item, at) =>
                          at === index ? { ...item, pickId: event.target.value, by: 'hand' } : item,
                        ),
                      )
                    }
                  >
                    <option value="">
                      {entry.ambiguous
                        ? 'Fits several picks: choose one'
                        : 'No pick found: choose one'}
                    </option>
                    {picks.map((pick) => (
                      <option key={pick.pickId} value={pick.pickId}>
                        {pick.sitterName} · {pick.fileName}
                      </option>
                    ))}
                  </select>
                </label>
                {entry.by && entry.pickId ? (
                  <span className="text-sm text-ink-muted">{byWords[entry.by]}</span>
                ) : null}
              </li>
            ))}
          </ul>
          <div>
            <Button onClick={send} disabled={ready.length === 0}>
              Send {ready.length} final{ready.length === 1 ? '' : 's'}
            </Button>
          </div>
        </>
      ) : null}
      {snapshot.files.length > 0 ? (
        <ul className="flex flex-col gap-1 text-sm" aria-label="Finals sent">
          {snapshot.files.map((item) => (
            <li key={item.key}>
              {item.cardPath}:{' '}
              {item.state === 'stored'
                ? 'stored beside the original'
                : item.state === 'refused' || item.state === 'failed'
                  ? item.message
                  : 'sending…'}
            </li>
          ))}
        </ul>
      ) : null}
      {snapshot.counts.refused > 0 ? (
        <Notice tone="danger">Some files were refused: see the reason beside each.</Notice>
      ) : null}
    </div>
  );
}
