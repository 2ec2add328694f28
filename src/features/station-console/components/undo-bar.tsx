import { Button } from '../../../components/ui/button';

/** The last change, reversible until the next one is made. */
export function UndoBar({ label, onUndo }: { label: string; onUndo: () => void }) {
  return (
    <div className="pointer-events-none fixed inset-x-0 bottom-4 z-30 flex justify-center px-4">
      <div className="pointer-events-auto flex items-center gap-4 rounded-card bg-ink px-5 py-2 text-lg text-paper-raised shadow-card">
        <p>Just recorded: {label}</p>
        <Button variant="secondary" onClick={onUndo}>
          Undo
        </Button>
      </div>
    </div>
  );
}
