import type { CardFigures } from '../model/compute-card';

const stops = (value: number) => `${value >= 0 ? '+' : '−'}${Math.abs(value).toFixed(1)} stops`;
const metres = (mm: number) => (Number.isFinite(mm) ? `${(mm / 1000).toFixed(2)} m` : 'infinity');
const ratio = (value: number) => `${value.toFixed(value < 10 ? 1 : 0)}:1`;

/** The worked-out figures and the warnings, updated as the card is edited. */
export function CardFiguresPanel({ figures }: { figures: CardFigures }) {
  return (
    <div className="flex flex-col gap-4">
      <section aria-label="Warnings" aria-live="polite">
        {figures.warnings.length === 0 ? (
          <p className="rounded-control bg-success-50 px-3 py-2">No warnings for this card.</p>
        ) : (
          <ul className="flex flex-col gap-2">
            {figures.warnings.map((warning) => (
              <li
                key={warning.code}
                className="rounded-control border-l-4 border-caution-600 bg-caution-50 px-3 py-2"
              >
                {warning.message}
              </li>
            ))}
          </ul>
        )}
      </section>
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1.5 text-sm">
        {figures.lights.map((light) => (
          <div key={light.role} className="contents">
            <dt className="text-ink-muted">
              {light.role === 'background'
                ? 'Background light on the background'
                : `${light.role.charAt(0).toUpperCase() + light.role.slice(1)} on the sitter`}
            </dt>
            <dd>
              {light.role === 'key' ? 'reference' : stops(light.stopsRelativeToKey)}
              {light.apertureFromGuideNumber
                ? ` · needs f/${light.apertureFromGuideNumber.toFixed(1)} by guide number`
                : ''}
            </dd>
          </div>
        ))}
        {figures.ratio ? (
          <>
            <dt className="text-ink-muted">Key over fill</dt>
            <dd>{figures.ratio.stops.toFixed(1)} stops</dd>
            <dt className="text-ink-muted">Lighting ratio (key+fill : fill)</dt>
            <dd>{ratio(figures.ratio.lighting)}</dd>
            <dt className="text-ink-muted">Key-to-fill</dt>
            <dd>{ratio(figures.ratio.keyToFill)}</dd>
          </>
        ) : null}
        <dt className="text-ink-muted">Exposure value</dt>
        <dd>Ev {figures.exposureValue.toFixed(2)} (APEX)</dd>
        <dt className="text-ink-muted">Depth of field</dt>
        <dd>
          {metres(figures.depth.nearMm)} to {metres(figures.depth.farMm)} ·{' '}
          {Number.isFinite(figures.depth.totalMm)
            ? `${(figures.depth.totalMm / 10).toFixed(1)} cm`
            : 'to infinity'}
          {figures.coversFace ? ' · covers a face' : ' · less than a face'}
        </dd>
        <dt className="text-ink-muted">Hyperfocal distance</dt>
        <dd>
          {metres(figures.depth.hyperfocalMm)} (circle of confusion{' '}
          {figures.circleOfConfusionMm.toFixed(3)} mm)
        </dd>
        <dt className="text-ink-muted">Background</dt>
        <dd>
          About {figures.backgroundStopsBelowSitter.toFixed(1)} stops darker than the sitter under
          the key
        </dd>
      </dl>
      <section aria-label="Assumptions" className="text-sm text-ink-muted">
        <ul className="flex list-disc flex-col gap-1 pl-5">
          {figures.assumptions.map((assumption) => (
            <li key={assumption.code}>{assumption.message}</li>
          ))}
        </ul>
      </section>
    </div>
  );
}
