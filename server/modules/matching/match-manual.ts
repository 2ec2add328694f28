import type { FrameMatch, ManualDecision, MatchFrame, MatchSitting } from './match-frames';

/**
 * People's own decisions, over what the evidence says (`results`, by frame index): each keeps
 * the match it replaces as `automatic`. Decisions apply in order, so a later one about the same
 * frame keeps the earlier one as its `automatic`.
 */
export function applyManual(
  manual: ManualDecision[],
  frames: MatchFrame[],
  sittings: MatchSitting[],
  results: FrameMatch[],
) {
  const frameIndex = new Map(frames.map((frame, index) => [frame.id, index]));
  const sittingById = new Map(sittings.map((sitting) => [sitting.id, sitting]));
  for (const decision of manual) {
    const index = frameIndex.get(decision.frameId);
    if (index === undefined) continue; // a decision about a frame that is no longer part of the day
    const automatic = results[index]!;
    const sitting = decision.sittingId ? sittingById.get(decision.sittingId) : undefined;
    const personId = decision.personId ?? sitting?.personId ?? null;
    results[index] = {
      frameId: decision.frameId,
      sittingId: personId !== null && sitting?.personId === personId ? sitting.id : null,
      personId,
      reason: personId === null ? 'manual_test_frame' : 'manual',
      confidence: 1,
      automatic,
    };
  }
}
