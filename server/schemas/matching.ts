import { z } from 'zod';
import { uuidSchema } from './common';

/** Why a frame sits where it does; the words people read are in matchReasonLabels. */
export const matchReasons = [
  'slate',
  'after_slate',
  'capture_time',
  'frame_number',
  'conflict',
  'leftover',
  'manual',
  'manual_test_frame',
  'not_read_yet',
] as const;
export type MatchReasonName = (typeof matchReasons)[number];

export const matchReasonLabels: Record<MatchReasonName, string> = {
  slate: 'Shows this sitter’s slate',
  after_slate: 'Taken after this sitter’s slate',
  capture_time: 'Taken during this sitting (by the camera clock)',
  frame_number: 'Starts at the frame number typed at the station',
  conflict: 'Two sittings could own this frame',
  leftover: 'Nothing ties this frame to a sitter',
  manual: 'Placed by hand',
  manual_test_frame: 'Marked as a test frame',
  not_read_yet: 'Not matched yet',
};

export const decisionActions = ['move', 'test_frame', 'split'] as const;
export type DecisionActionName = (typeof decisionActions)[number];

/**
 * One change on the review screen: frames given to a sitter ("move"), marked as test frames,
 * or split off into a sitting of their own for another person ("split").
 */
export const matchDecisionRequestSchema = z
  .object({
    action: z.enum(decisionActions, { error: 'Say what to do with the frames.' }),
    frameIds: z
      .array(uuidSchema, { error: 'Choose the frames to change.' })
      .min(1, { error: 'Choose at least one frame.' })
      .max(5000, { error: 'Change at most 5,000 frames at a time.' }),
    personId: uuidSchema.nullish(),
  })
  .strict()
  .refine((value) => value.action === 'test_frame' || value.personId, {
    error: 'Choose the sitter the frames belong to.',
    path: ['personId'],
  })
  .refine((value) => value.action !== 'test_frame' || !value.personId, {
    error: 'A test frame belongs to nobody: leave the sitter out.',
    path: ['personId'],
  })
  .refine((value) => new Set(value.frameIds).size === value.frameIds.length, {
    error: 'A frame is listed twice.',
    path: ['frameIds'],
  });
export type MatchDecisionRequest = z.infer<typeof matchDecisionRequestSchema>;

export interface ReviewFrame {
  id: string;
  stationId: string;
  fileName: string;
  folder: number | null;
  number: number | null;
  capturedLocal: string | null;
  cameraSerial: string | null;
  personId: string | null;
  sittingId: string | null;
  reason: MatchReasonName;
  /** Where the evidence points when the frame is a conflict. */
  candidatePersonIds: string[];
  hasThumbnail: boolean;
}

export interface ReviewSitter {
  personId: string;
  sittingId: string | null;
  name: string;
  employeeId: string | null;
  stationId: string | null;
  startedAt: string | null;
  firstFrame: number | null;
  lastFrame: number | null;
  frames: number;
}

export interface MatchCounts {
  frames: number;
  matched: number;
  conflicts: number;
  leftovers: number;
  testFrames: number;
  notReadYet: number;
  /** Photographed, but no frame is theirs. */
  sittersWithoutFrames: number;
  /** Booked for the day, never photographed. */
  notPhotographed: number;
}

export interface MatchRunInfo {
  finishedAt: string;
  cause: 'frames' | 'sittings' | 'on_demand';
  changed: number;
  changes: Array<{
    frameId: string;
    fileName: string | null;
    from: string | null;
    to: string | null;
    /** A person's decision stands over the new automatic result. */
    pinned: boolean;
  }>;
  cameraOffsets: Array<{ camera: string; offsetMinutes: number }>;
  typedFrameMismatches: Array<{ sitterName: string; typed: number; slateFrame: number }>;
}

export interface DayReview {
  dayId: string;
  dayDate: string;
  clientName: string;
  stations: Array<{ id: string; name: string }>;
  counts: MatchCounts;
  lastRun: MatchRunInfo | null;
  /** A match is waiting or running: the screen refreshes until it is done. */
  matching: boolean;
  sitters: ReviewSitter[];
  notPhotographed: Array<{ personId: string; name: string; employeeId: string | null }>;
  frames: ReviewFrame[];
  /** The latest change that undo would take back. */
  lastChange: { changeId: string; action: DecisionActionName; frames: number } | null;
}

export interface DayFrameCounts {
  dayId: string;
  counts: Pick<MatchCounts, 'frames' | 'matched' | 'conflicts' | 'leftovers' | 'testFrames'>;
}
