import { Card } from '../../../components/ui/card';
import { formatDateTime } from '../../../lib/format';
import { useImportHistory } from '../api/list-import-history';

/** The last imports of this client: who, when, which file, what changed. */
export function ImportHistory({ clientId }: { clientId: string }) {
  const history = useImportHistory(clientId);
  const imports = history.data?.imports ?? [];
  return (
    <Card title="Earlier imports">
      {imports.length === 0 ? (
        <p className="text-ink-muted">No imports yet: the first one starts above.</p>
      ) : (
        <ul className="flex flex-col divide-y divide-line">
          {imports.map((entry) => (
            <li key={entry.id} className="py-2">
              <span className="font-medium">{entry.fileName}</span> ·{' '}
              {formatDateTime(entry.importedAt)}
              {entry.importedBy ? ` · ${entry.importedBy}` : ''}
              <span className="block text-sm text-ink-muted">
                {entry.added.toLocaleString()} added, {entry.updated.toLocaleString()} updated,{' '}
                {entry.unchanged.toLocaleString()} unchanged, {entry.deactivated.toLocaleString()}{' '}
                marked inactive, {entry.skipped.toLocaleString()} left out
              </span>
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}
