import { useParams } from 'react-router-dom';
import { setupCardSchema } from '../../../../server/schemas/setup-card';
import { SafetyCautions } from '../../../components/ui/safety-cautions';
import { useDaySetupCards } from '../../../features/setup-card/api/get-day-setup-cards';
import { CardFiguresPanel } from '../../../features/setup-card/components/card-figures';
import { PlanSketch } from '../../../features/setup-card/components/plan-sketch';
import { computeCard } from '../../../features/setup-card/model/compute-card';
import { powerLabel } from '../../../features/setup-card/model/power-scale';
import { shutterLabel } from '../../../features/setup-card/model/starter-card';

export { makeLoader } from './day-cards-loader';

/** One page per station (A4 or Letter through print CSS): sketch, settings, figures, cautions. */
export function SetupPrintPage() {
  const { dayId = '' } = useParams();
  const { data } = useDaySetupCards(dayId);
  if (!data) return null;
  return (
    <div className="flex flex-col gap-8 print:gap-0">
      <button
        type="button"
        onClick={() => window.print()}
        className="no-print min-h-touch self-start rounded-control bg-spruce-600 px-4 font-medium text-paper-raised"
      >
        Print
      </button>
      {data.stations.map((station) => {
        const parsed = setupCardSchema.safeParse(station.card);
        return (
          <article
            key={station.stationId}
            className="break-after-page rounded-card border border-line bg-paper-raised p-6 print:border-0 print:p-0"
          >
            <h1 className="text-xl font-semibold">
              Setup card · {station.stationName}
              {station.photographerName ? ` · ${station.photographerName}` : ''}
            </h1>
            <p className="mb-4 text-ink-muted">
              {data.clientName}, {data.officeName} · {data.dayDate} · {data.address}
              {data.room ? `, ${data.room}` : ''}
            </p>
            {parsed.success ? (
              <div className="grid gap-4 md:grid-cols-2 print:grid-cols-2">
                <div className="flex flex-col gap-3">
                  <PlanSketch card={parsed.data} />
                  <ul className="text-sm">
                    {parsed.data.lights.map((light) => (
                      <li key={light.role}>
                        <span className="font-medium capitalize">{light.role}</span>:{' '}
                        {powerLabel(light.power)} power, {light.distanceMetres} m
                        {light.modifier ? `, ${light.modifier}` : ''}
                      </li>
                    ))}
                    <li>
                      <span className="font-medium">Camera</span>:{' '}
                      {parsed.data.camera.focalLengthMm} mm, f/{parsed.data.camera.aperture},{' '}
                      {shutterLabel(parsed.data.camera.shutterSeconds)}, ISO{' '}
                      {parsed.data.camera.iso}
                    </li>
                  </ul>
                </div>
                <CardFiguresPanel figures={computeCard(parsed.data)} />
              </div>
            ) : (
              <p>No setup card saved for this station yet.</p>
            )}
            <h2 className="mt-4 font-semibold">Safety</h2>
            <SafetyCautions />
          </article>
        );
      })}
    </div>
  );
}
