import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { useMarkEyes, usePrepareSet, type DaySet } from '../api/looks';
import { EyeMarker } from './eye-marker';

const eyeWords: Record<string, string> = {
  no_face: 'No face was found',
  several_faces: 'Several faces were found',
  low_confidence: 'The eyes were found, but not surely',
};

/** Every sitter's renditions side by side, each with its eye line drawn, and the portraits that need a hand. */
export function SetGrid({ set }: { set: DaySet }) {
  const prepare = usePrepareSet(set.dayId);
  const mark = useMarkEyes(set.dayId);
  const [fixing, setFixing] = useState<string | null>(null);
  const [message, setMessage] = useState<{ tone: 'success' | 'danger'; text: string } | null>(null);
  const needHand = set.sitters.filter((sitter) => sitter.needsAHand);
  type Sitter = DaySet['sitters'][number];
  // The marks start where they are (found or marked before), so a wrong mark can be moved.
  const markerFor = (sitter: Sitter) =>
    sitter.eyes?.imageWidth && sitter.eyes.imageHeight ? (
      <EyeMarker
        pickId={sitter.pickId}
        imageWidth={sitter.eyes.imageWidth}
        imageHeight={sitter.eyes.imageHeight}
        initial={
          sitter.eyes.left && sitter.eyes.right
            ? { left: sitter.eyes.left, right: sitter.eyes.right }
            : null
        }
        busy={mark.isPending}
        onSave={(marks) =>
          mark.mutate(
            { pickId: sitter.pickId, ...marks },
            {
              onSuccess: () => {
                setFixing(null);
                setMessage({
                  tone: 'success',
                  text: `Eye marks saved for ${sitter.name}: rendering.`,
                });
              },
              onError: (error) =>
                setMessage({
                  tone: 'danger',
                  text: error instanceof ApiError ? error.message : 'Not saved.',
                }),
            },
          )
        }
      />
    ) : null;
  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-center gap-3">
        <Button
          busy={prepare.isPending}
          onClick={() =>
            prepare.mutate(undefined, {
              onSuccess: (result) =>
                setMessage({
                  tone: 'success',
                  text: `Finding the eyes in ${result.queued} portraits; renditions follow.`,
                }),
              onError: (error) =>
                setMessage({
                  tone: 'danger',
                  text: error instanceof ApiError ? error.message : 'Not started.',
                }),
            })
          }
        >
          Find eyes and render the set
        </Button>
        <span className="text-sm text-ink-muted">
          {set.sitters.length} portraits · {needHand.length} need a hand
        </span>
      </div>
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
      {needHand.length > 0 ? (
        <section
          aria-label="Needs a hand"
          className="flex flex-col gap-2 rounded-card border border-caution-600 bg-caution-50 p-3"
        >
          <h3 className="font-semibold">Needs a hand</h3>
          <p className="text-sm">
            Drag the two marks onto the centres of the eyes; your marks are used instead of the
            detection.
          </p>
          <ul className="flex flex-col gap-3">
            {needHand.map((sitter) => (
              <li key={sitter.pickId} className="flex flex-col gap-2">
                <span>
                  {sitter.name} · {sitter.fileName}:{' '}
                  {eyeWords[sitter.eyes?.status ?? ''] ?? 'Not looked at yet'}
                </span>
                {fixing === sitter.pickId ? (
                  markerFor(sitter)
                ) : (
                  <div>
                    <Button variant="secondary" onClick={() => setFixing(sitter.pickId)}>
                      Mark the eyes of {sitter.name}
                    </Button>
                  </div>
                )}
              </li>
            ))}
          </ul>
        </section>
      ) : null}
      <table className="w-full border-collapse text-left text-sm">
        <caption className="sr-only">The set, one row per portrait</caption>
        <thead>
          <tr>
            <th scope="col" className="p-2">
              Sitter
            </th>
            {set.renditions.map((rendition) => (
              <th key={rendition.name} scope="col" className="p-2">
                {rendition.name} ({rendition.width}×{rendition.height})
              </th>
            ))}
          </tr>
        </thead>
        <tbody>
          {set.sitters.map((sitter) => (
            <tr key={sitter.pickId} className="border-t border-line align-top">
              <th scope="row" className="p-2 font-medium">
                {sitter.name}
                <div className="font-normal text-ink-muted">{sitter.employeeId}</div>
                {sitter.eyes?.status === 'marked' ? (
                  <div className="font-normal text-spruce-700">eyes marked by hand</div>
                ) : null}
                {!sitter.needsAHand && sitter.eyes?.left && sitter.eyes.right ? (
                  fixing === sitter.pickId ? (
                    markerFor(sitter)
                  ) : (
                    <Button
                      variant="secondary"
                      className="mt-1"
                      onClick={() => setFixing(sitter.pickId)}
                    >
                      Move the eye marks of {sitter.name}
                    </Button>
                  )
                ) : null}
              </th>
              {set.renditions.map((rendition) => {
                const state = sitter.renditions.find((each) => each.name === rendition.name);
                return (
                  <td key={rendition.name} className="p-2">
                    {state?.status === 'rendered' ? (
                      <div
                        className="relative w-40"
                        style={{ aspectRatio: `${rendition.width} / ${rendition.height}` }}
                      >
                        <img
                          src={`/api/picks/${sitter.pickId}/renditions/${encodeURIComponent(rendition.name)}`}
                          alt={`${sitter.name}, ${rendition.name}`}
                          loading="lazy"
                          className="h-full w-full rounded-control"
                        />
                        {/* The eye line every portrait of the set shares. */}
                        <div
                          aria-hidden
                          className="absolute left-0 right-0 border-t border-dashed border-danger-600"
                          style={{ top: `${rendition.eyeLine * 100}%` }}
                        />
                      </div>
                    ) : state?.status === 'refused' ? (
                      <span className="text-danger-700">{state.refusal}</span>
                    ) : (
                      <span className="text-ink-muted">Not rendered yet</span>
                    )}
                  </td>
                );
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
