import { useState } from 'react';
import {
  setupCardSchema,
  type CardLight,
  type SetupCard,
} from '../../../../server/schemas/setup-card';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { useSaveSetupCard } from '../api/save-setup-card';
import { computeCard } from '../model/compute-card';
import { CameraFields } from './camera-fields';
import { CardFiguresPanel } from './card-figures';
import { issuesByPath } from './card-errors';
import { LightFields } from './light-fields';
import { PlanSketch } from './plan-sketch';

const optionalRoles: Array<CardLight['role']> = ['fill', 'background', 'hair'];

export function SetupCardEditor({
  dayId,
  stationId,
  initial,
}: {
  dayId: string;
  stationId: string;
  initial: SetupCard;
}) {
  const [card, setCard] = useState<SetupCard>(initial);
  const save = useSaveSetupCard(dayId);
  const parsed = setupCardSchema.safeParse(card);
  const errors = issuesByPath(parsed.success ? undefined : parsed.error);
  const figures = parsed.success ? computeCard(parsed.data) : null;
  const missing = optionalRoles.filter((role) => !card.lights.some((light) => light.role === role));

  const updateLight = (index: number, light: CardLight) =>
    setCard({ ...card, lights: card.lights.map((current, i) => (i === index ? light : current)) });

  return (
    <div className="grid gap-6 xl:grid-cols-[3fr_2fr]">
      <form
        aria-label="Setup card"
        noValidate
        className="flex flex-col gap-4"
        onSubmit={(event) => {
          event.preventDefault();
          if (parsed.success) save.mutate({ stationId, card: parsed.data });
        }}
      >
        {card.lights.map((light, index) => (
          <LightFields
            key={light.role}
            light={light}
            path={`lights.${index}`}
            errors={errors}
            onChange={(next) => updateLight(index, next)}
            onRemove={
              light.role === 'key'
                ? undefined
                : () => setCard({ ...card, lights: card.lights.filter((_, i) => i !== index) })
            }
          />
        ))}
        {missing.length > 0 ? (
          <div className="flex flex-wrap gap-2">
            {missing.map((role) => (
              <Button
                key={role}
                variant="secondary"
                onClick={() =>
                  setCard({
                    ...card,
                    lights: [
                      ...card.lights,
                      {
                        role,
                        power: 1 / 16,
                        modifier: '',
                        modifierLossStops: null,
                        distanceMetres: 1.5,
                        guideNumber: null,
                      },
                    ],
                  })
                }
              >
                Add a {role} light
              </Button>
            ))}
          </div>
        ) : null}
        <CameraFields
          camera={card.camera}
          errors={errors}
          onChange={(camera) => setCard({ ...card, camera })}
        />
        {errors.lights ? <Notice tone="danger">{errors.lights}</Notice> : null}
        {save.isError ? <Notice tone="danger">{save.error.message}</Notice> : null}
        <Button type="submit" busy={save.isPending} disabled={!parsed.success}>
          Save card
        </Button>
      </form>
      <div className="flex flex-col gap-4">
        {figures && parsed.success ? (
          <>
            <CardFiguresPanel figures={figures} />
            <PlanSketch card={parsed.data} />
          </>
        ) : (
          <Notice tone="caution">Correct the highlighted fields to see the figures.</Notice>
        )}
      </div>
    </div>
  );
}
