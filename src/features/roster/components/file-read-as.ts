import type { RosterDraft } from '../../../../server/schemas/roster';
import { plural } from '../../../lib/format';

/** "staff.csv: 243 rows, read as UTF-8 with “;” between values": how the upload was read. */
export function fileReadAs(
  draft: Pick<RosterDraft, 'fileName' | 'rowCount' | 'encoding' | 'delimiter'>,
): string {
  const delimiter = draft.delimiter === '\t' ? 'tab' : draft.delimiter;
  return `${draft.fileName}: ${plural(draft.rowCount, 'row')}, read as ${draft.encoding.toUpperCase()} with “${delimiter}” between values.`;
}
