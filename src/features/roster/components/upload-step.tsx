import { useId, useRef, useState, type DragEvent } from 'react';
import type { RosterDraft } from '../../../../server/schemas/roster';
import { Notice } from '../../../components/ui/notice';
import { useUploadRoster } from '../api/upload-roster';

const maxBytes = 10 * 1024 * 1024;

/** Step 1: choose or drop the CSV; it is sent with a progress bar and parsed on the server. */
export function UploadStep({
  clientId,
  onUploaded,
}: {
  clientId: string;
  onUploaded: (draft: RosterDraft) => void;
}) {
  const upload = useUploadRoster();
  const [progress, setProgress] = useState(0);
  const [problem, setProblem] = useState<string | null>(null);
  const [dragging, setDragging] = useState(false);
  const input = useRef<HTMLInputElement>(null);
  const inputId = useId();
  const hintId = `${inputId}-hint`;

  const send = (file: File | undefined) => {
    setProblem(null);
    if (!file) return;
    if (file.size === 0)
      return setProblem('The file is empty. Choose the CSV export of your staff list.');
    if (file.size > maxBytes) {
      return setProblem(
        'The file is larger than 10 MB. Split it or remove unused columns, then try again.',
      );
    }
    setProgress(0);
    upload.mutate(
      { clientId, file, onProgress: setProgress },
      {
        onSuccess: onUploaded,
        onError: (error) => setProblem(error.message),
      },
    );
  };

  const drop = (event: DragEvent) => {
    event.preventDefault();
    setDragging(false);
    send(event.dataTransfer.files[0]);
  };

  return (
    <div className="flex flex-col gap-4">
      {problem ? <Notice tone="danger">{problem}</Notice> : null}
      <div
        onDragOver={(event) => {
          event.preventDefault();
          setDragging(true);
        }}
        onDragLeave={() => setDragging(false)}
        onDrop={drop}
        className={`flex flex-col items-center gap-3 rounded-card border-2 border-dashed px-6 py-10 text-center ${
          dragging ? 'border-spruce-500 bg-spruce-50' : 'border-line-strong bg-paper-sunk'
        }`}
      >
        <label htmlFor={inputId} className="font-semibold">
          Staff list (CSV file)
        </label>
        <p id={hintId} className="text-sm text-ink-muted">
          Drop the file here or choose it. Comma-, semicolon- or tab-separated; UTF-8, UTF-16 or
          Windows-1252; up to 10 MB and 50,000 rows, with a header row.
        </p>
        <input
          ref={input}
          id={inputId}
          type="file"
          accept=".csv,.txt,text/csv,text/plain"
          aria-describedby={hintId}
          disabled={upload.isPending}
          onChange={(event) => {
            send(event.target.files?.[0]);
            // Cleared, so choosing the same file again (corrected after a refusal) uploads it.
            event.target.value = '';
          }}
          className="min-h-touch text-sm file:mr-3 file:min-h-touch file:rounded-control file:border-0 file:bg-spruce-600 file:px-4 file:font-medium file:text-paper-raised"
        />
      </div>
      {upload.isPending ? (
        <div className="flex flex-col gap-1">
          <progress
            max={1}
            value={progress < 1 ? progress : undefined}
            aria-label="Uploading and reading the file"
            className="h-2 w-full"
          />
          <p className="text-sm text-ink-muted" aria-live="polite">
            {progress < 1
              ? `Sending the file: ${Math.round(progress * 100)} %`
              : 'Reading and checking every row…'}
          </p>
        </div>
      ) : null}
    </div>
  );
}
