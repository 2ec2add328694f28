import { OUTAGE_MESSAGE, useDatabaseOutage } from '../../lib/database-outage';
import { Notice } from './notice';

/** Shown over every page while the server cannot reach its database; goes when it is back. */
export function DatabaseOutageNotice() {
  const outage = useDatabaseOutage();
  if (!outage) return null;
  return (
    <div className="fixed inset-x-0 top-0 z-50 p-2">
      <Notice tone="caution">{OUTAGE_MESSAGE}</Notice>
    </div>
  );
}
