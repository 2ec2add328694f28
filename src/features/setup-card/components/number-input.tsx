import { useId, useState } from 'react';

/**
 * A decimal input that keeps what is typed (e.g. "1." on the way to "1.5") and reports a number,
 * or NaN while the text is not one; the card's schema then names the problem.
 */
export function NumberInput(props: {
  label: string;
  value: number | null;
  onChange: (value: number | null) => void;
  unit?: string;
  error?: string | undefined;
  allowEmpty?: boolean;
}) {
  const id = useId();
  const [text, setText] = useState(props.value === null ? '' : String(props.value));
  const [shown, setShown] = useState(props.value);
  if (props.value !== shown) {
    setShown(props.value);
    if (!(props.value !== null && Number(text) === props.value))
      setText(props.value === null ? '' : String(props.value));
  }
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-medium">
        {props.label}
        {props.unit ? <span className="font-normal text-ink-muted"> ({props.unit})</span> : null}
      </label>
      <input
        id={id}
        inputMode="decimal"
        value={text}
        aria-invalid={props.error ? true : undefined}
        aria-describedby={props.error ? `${id}-error` : undefined}
        onChange={(event) => {
          const next = event.target.value.replace(',', '.');
          setText(event.target.value);
          const value =
            next.trim() === '' && props.allowEmpty
              ? null
              : Number(next.trim() === '' ? Number.NaN : next);
          setShown(value);
          props.onChange(value);
        }}
        className={`min-h-touch w-full rounded-control border bg-paper-raised px-3 ${props.error ? 'border-danger-600' : 'border-line-strong'}`}
      />
      {props.error ? (
        <p id={`${id}-error`} role="alert" className="text-sm text-danger-600">
          {props.error}
        </p>
      ) : null}
    </div>
  );
}
