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
  const tone =
    signedOut || !online
      ? 'bg-caution-50 border-caution-600'
      : waiting > 0
        ? 'bg-spruce-50 border-spruce-500'
        : 'bg-success-50 border-success-600';
  return (
    <p
      role="status"
      aria-label="Sync"
      className={`inline-flex min-h-touch items-center rounded-control border-2 px-3 text-base font-semibold ${tone}`}
    >
      {text}
    </p>
  );
}
