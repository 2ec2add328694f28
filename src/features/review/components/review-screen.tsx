import { useWindowVirtualizer } from '@tanstack/react-virtual';
import { useCallback, useMemo, useState } from 'react';
import type { DayReview, MatchDecisionRequest } from '../../../../server/schemas/matching';
import { Button } from '../../../components/ui/button';
import { SelectField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { useStudioPick } from '../../proofs/api/day-proofs';
import { useDecision, useRequestMatch, useUndoLastChange } from '../api/review-changes';
import { reviewGroups, type ReviewGroup } from '../model/review-groups';
import { ChoosePerson } from './choose-person';
import { ReviewBlock } from './review-block';
import { ReviewSummary } from './review-summary';
import { useFrameSelection } from './use-frame-selection';

const actionWords = {
  move: 'given to a sitter',
  test_frame: 'marked as test frames',
  split: 'split off',
};

/** The review of one day: every frame under its sitter, doubts on top, fixes by drag or menu. */
export function ReviewScreen({ review }: { review: DayReview }) {
  const [stationId, setStationId] = useState('');
  const [onlyProblems, setOnlyProblems] = useState(false);
  const [choosing, setChoosing] = useState<'move' | 'split' | null>(null);
  const [message, setMessage] = useState<{ tone: 'success' | 'danger'; text: string } | null>(null);
  const selection = useFrameSelection();
  const decision = useDecision(review.dayId);
  const undo = useUndoLastChange(review.dayId);
  const run = useRequestMatch(review.dayId);
  const studioPick = useStudioPick(review.dayId);

  const groups = useMemo(
    () => reviewGroups(review, { stationId, onlyProblems }),
    [review, stationId, onlyProblems],
  );
  const names = useMemo(
    () => new Map(review.sitters.map((sitter) => [sitter.personId, sitter.name])),
    [review.sitters],
  );
  const stationNames = useMemo(
    () => new Map(review.stations.map((station) => [station.id, station.name])),
    [review.stations],
  );

  // Where the list starts on the page, for the window virtualiser's arithmetic.
  const [scrollMargin, setScrollMargin] = useState(0);
  const listRef = useCallback((node: HTMLDivElement | null) => {
    if (node) setScrollMargin(node.getBoundingClientRect().top + window.scrollY);
  }, []);
  const virtualizer = useWindowVirtualizer({
    count: groups.length,
    estimateSize: (index) => 120 + Math.ceil((groups[index]?.frames.length ?? 0) / 6) * 140,
    overscan: 4,
    scrollMargin,
  });

  const send = (request: MatchDecisionRequest, done: string) => {
    setMessage(null);
    decision.mutate(request, {
      onSuccess: () => {
        selection.clear();
        setChoosing(null);
        setMessage({ tone: 'success', text: done });
      },
      onError: (error) =>
        setMessage({
          tone: 'danger',
          text: error instanceof ApiError ? error.message : 'That change was not saved.',
        }),
    });
  };
  const count = (ids: string[]) => `${ids.length} frame${ids.length === 1 ? '' : 's'}`;
  const giveTo = (frameIds: string[], personId: string) =>
    send(
      { action: 'move', frameIds, personId },
      `${count(frameIds)} given to ${names.get(personId) ?? 'the sitter'}.`,
    );
  const markTest = (frameIds: string[]) =>
    send({ action: 'test_frame', frameIds }, `${count(frameIds)} marked as test frames.`);
  const splitTo = (frameIds: string[], personId: string) =>
    send({ action: 'split', frameIds, personId }, `${count(frameIds)} split off.`);

  const dropOnto = (group: ReviewGroup) =>
    group.kind === 'sitter' && group.sitter.sittingId
      ? (frameIds: string[]) => giveTo(frameIds, group.sitter.personId)
      : group.kind === 'test'
        ? markTest
        : null;
  const chosen = [...selection.selected];
  const single =
    chosen.length === 1 ? review.frames.find((frame) => frame.id === chosen[0]) : undefined;

  return (
    <div className="flex flex-col gap-4">
      <ReviewSummary review={review} onRun={() => run.mutate()} running={run.isPending} />
      <div className="flex flex-wrap items-end gap-4">
        <div className="w-64">
          <SelectField
            label="Station"
            value={stationId}
            onChange={setStationId}
            options={[
              { value: '', label: 'All stations' },
              ...review.stations.map((station) => ({ value: station.id, label: station.name })),
            ]}
          />
        </div>
        <label className="flex min-h-touch items-center gap-2">
          <input
            type="checkbox"
            className="size-5"
            checked={onlyProblems}
            onChange={(event) => setOnlyProblems(event.target.checked)}
          />
          Hide sitters whose frames are all sure
        </label>
        {review.lastChange ? (
          <Button
            variant="secondary"
            busy={undo.isPending}
            onClick={() =>
              undo.mutate(undefined, {
                onSuccess: () => setMessage({ tone: 'success', text: 'Last change undone.' }),
              })
            }
          >
            Undo: {review.lastChange.frames} frame{review.lastChange.frames === 1 ? '' : 's'}{' '}
            {actionWords[review.lastChange.action]}
          </Button>
        ) : null}
      </div>
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
      {chosen.length > 0 ? (
        <div
          className="sticky top-0 z-10 flex flex-col gap-3 rounded-card border border-spruce-600 bg-paper-raised p-3 shadow-card"
          aria-label="Chosen frames"
          role="region"
        >
          {choosing ? (
            <ChoosePerson
              dayId={review.dayId}
              mode={choosing}
              sitters={review.sitters}
              frames={chosen.length}
              onCancel={() => setChoosing(null)}
              onPick={(personId) =>
                choosing === 'move' ? giveTo(chosen, personId) : splitTo(chosen, personId)
              }
            />
          ) : (
            <div className="flex flex-wrap items-center gap-2">
              <span className="font-medium">{count(chosen)} chosen</span>
              <Button onClick={() => setChoosing('move')}>Give to a sitter…</Button>
              <Button variant="secondary" onClick={() => markTest(chosen)}>
                Mark as test frames
              </Button>
              <Button variant="secondary" onClick={() => setChoosing('split')}>
                Split off to someone else…
              </Button>
              {single?.personId ? (
                <Button
                  variant="secondary"
                  onClick={() =>
                    studioPick.mutate(
                      { personId: single.personId!, frameId: single.id },
                      {
                        onSuccess: () =>
                          setMessage({
                            tone: 'success',
                            text: `Studio’s pick for ${names.get(single.personId!) ?? 'the sitter'} saved: it stands if they do not choose.`,
                          }),
                        onError: (error) => setMessage({ tone: 'danger', text: error.message }),
                      },
                    )
                  }
                >
                  Make it the studio’s pick
                </Button>
              ) : null}
              <Button variant="quiet" onClick={selection.clear}>
                Clear the choice
              </Button>
            </div>
          )}
        </div>
      ) : (
        <p className="text-sm text-ink-muted">
          Click frames to choose them (shift-click for a run), then use the buttons that appear, or
          drag them onto a sitter.
        </p>
      )}
      <div ref={listRef} style={{ height: virtualizer.getTotalSize(), position: 'relative' }}>
        {virtualizer.getVirtualItems().map((item) => {
          const group = groups[item.index]!;
          return (
            <div
              key={group.key}
              data-index={item.index}
              ref={virtualizer.measureElement}
              className="absolute left-0 w-full pb-3"
              style={{
                transform: `translateY(${item.start - virtualizer.options.scrollMargin}px)`,
              }}
            >
              <ReviewBlock
                group={group}
                stationName={
                  group.kind === 'sitter' && group.sitter.stationId
                    ? (stationNames.get(group.sitter.stationId) ?? '')
                    : ''
                }
                selected={selection.selected}
                candidateNames={(frame) =>
                  frame.candidatePersonIds.map((id) => names.get(id) ?? 'another sitter')
                }
                onChoose={(block, frameId, event) => selection.choose(block.frames, frameId, event)}
                dragIds={selection.dragIds}
                onDropFrames={dropOnto(group)}
              />
            </div>
          );
        })}
      </div>
      {review.notPhotographed.length > 0 ? (
        <details className="text-sm">
          <summary className="cursor-pointer text-spruce-700">
            Booked but not photographed ({review.notPhotographed.length})
          </summary>
          <ul className="mt-1 list-disc pl-5">
            {review.notPhotographed.map((person) => (
              <li key={person.personId}>
                {person.name}
                {person.employeeId ? ` · ${person.employeeId}` : ''}
              </li>
            ))}
          </ul>
        </details>
      ) : null}
    </div>
  );
}
