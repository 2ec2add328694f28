import { useState } from 'react';
import { formatFrame } from '../../../../server/schemas/console-rules';

const keys = ['1', '2', '3', '4', '5', '6', '7', '8', '9', 'clear', '0', 'back'] as const;

/**
 * A numeric keypad for the camera's frame number (DCF 0001-9999): big keys for one thumb,
 * no on-screen keyboard to cover the slate. A pre-filled number is replaced by the first digit
 * typed, not appended to (0450 then 0-4-5-1 gives 0451, not 4510).
 */
export function FrameKeypad({
  label,
  value,
  onChange,
  error,
}: {
  label: string;
  value: string;
  onChange: (value: string) => void;
  error?: string | null;
}) {
  const [replaceNext, setReplaceNext] = useState(value !== '');
  const press = (key: (typeof keys)[number]) => {
    const replacing = replaceNext;
    setReplaceNext(false);
    if (key === 'clear') onChange('');
    else if (key === 'back') onChange(value.slice(0, -1));
    else if (replacing) onChange(key);
    else if (value.length < 4) onChange(value + key);
  };
  return (
    <div role="group" aria-label={label} className="flex flex-col gap-3">
      <p className="text-base font-medium text-ink-muted">{label}</p>
      <output
        aria-live="polite"
        aria-label={label}
        className="block rounded-control border-2 border-line-strong bg-paper-raised px-4 py-2 text-center font-mono text-5xl tracking-widest text-ink"
      >
        {value ? formatFrame(Number(value)) : '––––'}
      </output>
      {error ? (
        <p role="alert" className="text-base font-medium text-danger-600">
          {error}
        </p>
      ) : null}
      <div className="grid grid-cols-3 gap-2">
        {keys.map((key) => (
          <button
            key={key}
            type="button"
            onClick={() => press(key)}
            aria-label={key === 'back' ? 'Delete last digit' : key === 'clear' ? 'Clear' : key}
            className="min-h-16 rounded-control border border-line-strong bg-paper-raised text-2xl font-semibold text-ink active:bg-spruce-100"
          >
            {key === 'back' ? '⌫' : key === 'clear' ? 'C' : key}
          </button>
        ))}
      </div>
    </div>
  );
}

/** Reads the keypad's digits as a frame number, or explains what is wrong. */
export function parseFrame(value: string): { frame: number } | { error: string } {
  const frame = Number(value);
  if (!value || !Number.isInteger(frame)) return { error: 'Enter the frame number.' };
  if (frame < 1 || frame > 9999) return { error: 'Frame numbers run from 0001 to 9999.' };
  return { frame };
}

/** How far a typed number may sit from the expected one before the console asks. */
const FAR_FRAMES = 300;

/**
 * Why a typed frame number deserves a second look, or null: far from the expected number
 * (counting a rollover past 9999 as near), or below it, which happens only after a card change.
 */
export function frameDoubt(typed: number, expected: number | null): string | null {
  if (expected === null) return null;
  const forward = (typed - expected + 9999) % 9999;
  if (typed < expected && forward > FAR_FRAMES) {
    return `${formatFrame(typed)} is below the expected ${formatFrame(expected)}. Did the card change?`;
  }
  if (forward > FAR_FRAMES) {
    return `${formatFrame(typed)} is far from the expected ${formatFrame(expected)}. Check the camera's number.`;
  }
  return null;
}
