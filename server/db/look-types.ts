import type { ColumnType } from 'kysely';

type DefaultedTimestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type OptionalTimestamp = ColumnType<
  Date | null,
  Date | string | null | undefined,
  Date | string | null
>;
type Defaulted<T> = ColumnType<T, T | undefined, T>;
type Optional<T> = ColumnType<T | null, T | null | undefined, T | null>;
type Json<T> = ColumnType<T, string, string>;
/** bigint: pg hands it over as a string. */
type BigIntColumn = ColumnType<string, number | string, number | string>;

export type EyeStatus = 'found' | 'no_face' | 'several_faces' | 'low_confidence' | 'marked';

export interface ClientLooksTable {
  clientId: string;
  name: string;
  /** The renditions as server/schemas/looks.ts validates them. */
  renditions: Json<unknown[]>;
  fileNameTemplate: Defaulted<string>;
  version: Defaulted<number>;
  updatedByUserId: Optional<string>;
  updatedAt: DefaultedTimestamp;
}

export interface PortraitEyesTable {
  pickId: string;
  sourceKey: string;
  status: EyeStatus;
  leftX: Optional<number>;
  leftY: Optional<number>;
  rightX: Optional<number>;
  rightY: Optional<number>;
  rollDeg: Optional<number>;
  confidence: Defaulted<number>;
  imageWidth: number;
  imageHeight: number;
  markedByUserId: Optional<string>;
  updatedAt: DefaultedTimestamp;
}

export interface PortraitRenditionsTable {
  pickId: string;
  renditionName: string;
  status: 'rendered' | 'refused';
  refusal: Optional<string>;
  key: Optional<string>;
  byteSize: ColumnType<string | null, number | string | null | undefined, number | string | null>;
  sha256: Optional<string>;
  width: Optional<number>;
  height: Optional<number>;
  sourceKey: string;
  lookVersion: number;
  renderedAt: DefaultedTimestamp;
}

export interface DeliveriesTable {
  id: string;
  dayId: string;
  release: number;
  releasedByUserId: Optional<string>;
  releasedAt: DefaultedTimestamp;
  files: number;
  changed: number;
}

export interface DeliveredRenditionsTable {
  id: string;
  dayId: string;
  deliveryId: string;
  personId: string;
  pickId: string;
  renditionName: string;
  fileName: string;
  key: string;
  byteSize: BigIntColumn;
  sha256: string;
  changed: boolean;
}

export interface SitterDownloadLinksTable {
  id: string;
  dayId: string;
  personId: string;
  tokenHash: string;
  expiresAt: ColumnType<Date, Date | string, Date | string>;
  revokedAt: OptionalTimestamp;
  createdAt: DefaultedTimestamp;
}
