import type { ColumnType } from 'kysely';
import type { SetupCard } from '../schemas/setup-card';

export interface SetupCardsTable {
  stationId: string;
  card: ColumnType<SetupCard, string, string>;
  updatedAt: ColumnType<Date, Date | string | undefined, Date | string>;
  updatedByUserId: string | null;
}
