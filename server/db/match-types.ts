import type { ColumnType } from 'kysely';

type DefaultedTimestamp = ColumnType<Date, Date | string | undefined, Date | string>;
type OptionalTimestamp = ColumnType<
  Date | null,
  Date | string | null | undefined,
  Date | string | null
>;
type DefaultedJson<T> = ColumnType<T, string | undefined, string>;

export type AutomaticReason =
  'slate' | 'after_slate' | 'capture_time' | 'frame_number' | 'conflict' | 'leftover';
export type DecisionAction = 'move' | 'test_frame' | 'split';
export type MatchCause = 'frames' | 'sittings' | 'on_demand';

export interface MatchChange {
  frameId: string;
  fromPersonId: string | null;
  toPersonId: string | null;
  fromReason: AutomaticReason | null;
  toReason: AutomaticReason;
}

export interface MatchRunsTable {
  id: string;
  dayId: string;
  cause: MatchCause;
  requestedByUserId: string | null;
  finishedAt: DefaultedTimestamp;
  frames: number;
  matched: number;
  conflicts: number;
  leftovers: number;
  changed: number;
  changes: DefaultedJson<MatchChange[]>;
  cameraOffsets: DefaultedJson<Record<string, number>>;
  typedFrameMismatches: DefaultedJson<
    Array<{ sittingId: string; typed: number; slateFrame: number }>
  >;
}

export interface FrameMatchesTable {
  frameId: string;
  dayId: string;
  runId: string;
  sittingId: string | null;
  personId: string | null;
  reason: AutomaticReason;
  confidence: number;
  candidates: ColumnType<string[], string[] | undefined, string[]>;
}

export interface MatchDecisionsTable {
  id: string;
  dayId: string;
  changeId: string;
  frameId: string;
  action: DecisionAction;
  personId: string | null;
  sittingId: string | null;
  decidedByUserId: string | null;
  decidedAt: DefaultedTimestamp;
  undoneAt: OptionalTimestamp;
}
