import type { ColumnType, Generated } from 'kysely';

type DefaultedTimestamp = ColumnType<Date, Date | string | undefined, Date | string>;
/** bigint columns arrive from pg as strings. */
type BigIntColumn = ColumnType<string, number | string, number | string>;

export interface PriceListsTable {
  clientId: string;
  currency: string;
  dayRateMinor: number;
  perStationMinor: number;
  perPersonMinor: number;
  perExtraPickMinor: number;
  perRetouchMinor: number;
  perExtraRenditionMinor: number;
  renditionsIncluded: ColumnType<number, number | undefined, number>;
  taxRateBasisPoints: number;
  updatedByUserId: string | null;
  updatedAt: DefaultedTimestamp;
}

export interface InvoiceSequencesTable {
  year: number;
  lastNumber: number;
}

export interface InvoicesTable {
  id: Generated<string>;
  number: string;
  year: number;
  sequence: number;
  clientId: string;
  dayId: string;
  currency: string;
  subtotalMinor: BigIntColumn;
  taxMinor: BigIntColumn;
  totalMinor: BigIntColumn;
  /** What the invoice prints, as issued (see InvoiceSnapshot in server/schemas/invoices.ts). */
  snapshot: ColumnType<unknown, string, never>;
  issuedAt: ColumnType<Date, Date | string, never>;
  issuedByUserId: string | null;
}
