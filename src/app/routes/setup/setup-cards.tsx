import { useState } from 'react';
import { Link, useParams } from 'react-router-dom';
import { Card } from '../../../components/ui/card';
import { SelectField } from '../../../components/ui/field';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { PageHeading } from '../../../components/ui/page-heading';
import { SafetyCautions } from '../../../components/ui/safety-cautions';
import { useCopySetupCard } from '../../../features/setup-card/api/copy-setup-card';
import { useDaySetupCards } from '../../../features/setup-card/api/get-day-setup-cards';
import { useCardSources } from '../../../features/setup-card/api/list-card-sources';
import { SetupCardEditor } from '../../../features/setup-card/components/setup-card-editor';
import { starterCard } from '../../../features/setup-card/model/starter-card';
import { formatDateTime } from '../../../lib/format';

export { makeLoader } from './day-cards-loader';

/** The setup card of each station of a day: edit, check the figures, copy, print. */
export function SetupCardsPage() {
  const { dayId = '' } = useParams();
  const { data } = useDaySetupCards(dayId);
  const sources = useCardSources();
  const copy = useCopySetupCard(dayId);
  const [selected, setSelected] = useState(0);
  const [copyFrom, setCopyFrom] = useState('');
  if (!data) return null;
  const station = data.stations[selected] ?? data.stations[0];

  return (
    <>
      <PageHeading title="Setup cards">
        {data.clientName}, {data.officeName} · {data.dayDate} · {data.address}
        {data.room ? `, ${data.room}` : ''}
      </PageHeading>
      <div className="no-print mb-4 flex flex-wrap items-center gap-2">
        <div className="flex flex-wrap gap-2" role="tablist" aria-label="Stations">
          {data.stations.map((item, index) => (
            <button
              key={item.stationId}
              type="button"
              role="tab"
              aria-selected={index === selected}
              onClick={() => setSelected(index)}
              className={`min-h-touch rounded-control border px-4 font-medium ${index === selected ? 'border-spruce-600 bg-spruce-600 text-paper-raised' : 'border-line-strong bg-paper-raised text-spruce-700'}`}
            >
              {item.stationName}
              {item.card ? '' : ' (no card yet)'}
            </button>
          ))}
        </div>
        <Link
          to={`/days/${dayId}/setup/print`}
          className="ml-auto inline-flex min-h-touch items-center font-medium text-spruce-700 underline"
        >
          Print view
        </Link>
      </div>
      {station ? (
        <div className="flex flex-col gap-5">
          <Card
            title={`${station.stationName}${station.photographerName ? ` · ${station.photographerName}` : ''}`}
          >
            {station.updatedAt ? (
              <p className="mb-3 text-sm text-ink-muted" role="status">
                Last saved {formatDateTime(station.updatedAt)}
              </p>
            ) : (
              <p className="mb-3 text-ink-muted">
                This station has no card yet: it starts from a typical key-plus-fill set.
              </p>
            )}
            <SetupCardEditor
              key={`${station.stationId}-${station.updatedAt ?? 'new'}`}
              dayId={dayId}
              stationId={station.stationId}
              initial={station.card ?? starterCard}
            />
          </Card>
          <Card title="Copy another station's card">
            <form
              aria-label="Copy a card"
              className="flex flex-wrap items-end gap-3"
              onSubmit={(event) => {
                event.preventDefault();
                if (copyFrom)
                  copy.mutate({ stationId: station.stationId, fromStationId: copyFrom });
              }}
            >
              <div className="min-w-72 flex-1">
                <SelectField
                  label="Copy from"
                  value={copyFrom}
                  onChange={setCopyFrom}
                  options={[
                    { value: '', label: 'Choose a station…' },
                    ...(sources.data?.sources ?? [])
                      .filter((source) => source.stationId !== station.stationId)
                      .map((source) => ({ value: source.stationId, label: source.label })),
                  ]}
                />
              </div>
              <Button type="submit" variant="secondary" busy={copy.isPending} disabled={!copyFrom}>
                Copy to {station.stationName}
              </Button>
            </form>
            {copy.isError ? (
              <div className="mt-3">
                <Notice tone="danger">{copy.error.message}</Notice>
              </div>
            ) : null}
          </Card>
          <Card title="Safety on the set">
            <SafetyCautions />
          </Card>
        </div>
      ) : (
        <Notice tone="caution">This day has no stations yet.</Notice>
      )}
    </>
  );
}
