import type { ColumnType, Generated } from 'kysely';

type Timestamp = ColumnType<Date, Date | string | undefined, Date | string>;

export interface DayChangeProposalsTable {
  id: Generated<string>;
  dayId: string;
  kind: 'edit' | 'cancel';
  /** The edit request as sent (validated again when the studio applies it). */
  changes: ColumnType<unknown, string | undefined, string>;
  note: Generated<string>;
  status: Generated<'waiting' | 'applied' | 'declined'>;
  proposedByUserId: string | null;
  decidedByUserId: string | null;
  createdAt: Generated<Date>;
  decidedAt: Timestamp | null;
}
