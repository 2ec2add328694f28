/**
 * Whether the tablet's changes are on the server. It says "saved" only when nothing is
 * waiting; otherwise it counts what is still only on this tablet.
 */
export function SyncIndicator({
  waiting,
  online,
  fromTablet,
  signedOut,
}: {
  waiting: number;
  online: boolean;
  fromTablet: boolean;
  signedOut: boolean;
}) {
  const changes = `${waiting} ${waiting === 1 ? 'change' : 'changes'} waiting`;
  const text = signedOut
    ? `Signed out — ${changes}: sign in again to send them`
    : !online
      ? `Offline — ${waiting > 0 ? changes : 'nothing waiting'}`
      : waiting > 0
        ? `Sending — ${changes}`
        : fromTablet
          ? 'Showing the copy on this tablet'
          : 'All changes saved';
  const dot =
    signedOut || !online ? 'bg-caution-600' : waiting > 0 ? 'bg-spruce-500' : 'bg-success-600';
  return (
    <p
      role="status"
      aria-label="Sync"
      // A plain line of text with a dot, so it never reads as a button.
      className="inline-flex items-center gap-2 text-base font-semibold"
    >
      <span aria-hidden className={`size-3 shrink-0 rounded-full ${dot}`} />
      {text}
    </p>
  );
}
