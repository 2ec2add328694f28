import type { ReactNode } from 'react';
import { Button } from './button';

/**
 * A button for a step that cannot be taken back (issuing an invoice, releasing a set): pressed,
 * it gives way to what the step will do (`children`), the button that does it, and "Not yet".
 */
export function ConfirmStep({
  open,
  label,
  trigger,
  confirm,
  busy = false,
  disabled = false,
  onOpen,
  onConfirm,
  onCancel,
  children,
}: {
  open: boolean;
  /** The confirm group's accessible name, e.g. "Confirm the release". */
  label: string;
  trigger: string;
  confirm: string;
  busy?: boolean;
  /** The step cannot be taken now (the screen says why beside it). */
  disabled?: boolean;
  onOpen: () => void;
  onConfirm: () => void;
  onCancel: () => void;
  children: ReactNode;
}) {
  if (!open) {
    return (
      <div>
        <Button disabled={disabled} onClick={onOpen}>
          {trigger}
        </Button>
      </div>
    );
  }
  return (
    <div role="group" aria-label={label} className="flex flex-col gap-3">
      {children}
      <div className="flex flex-wrap gap-3">
        <Button busy={busy} onClick={onConfirm}>
          {confirm}
        </Button>
        <Button variant="secondary" disabled={busy} onClick={onCancel}>
          Not yet
        </Button>
      </div>
    </div>
  );
}
