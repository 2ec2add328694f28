import { useState } from 'react';
import { lookSchema, type Rendition } from '../../../../server/schemas/looks';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { TextField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { useNamePreview, useSaveLook, type LookResponse } from '../api/looks';

const tokens = [
  'employee_id',
  'given',
  'family',
  'preferred',
  'office',
  'department',
  'rendition',
  'day',
];
const sourceLabels: Record<string, string> = {
  name: 'Name',
  width: 'Width',
  height: 'Height',
  eyeLine: 'Eye line',
  headSize: 'Head size',
  centreX: 'Centre',
  overflow: 'Past the edge',
  fillColour: 'Colour',
  jpegQuality: 'JPEG quality',
  maxRotationDeg: 'Largest rotation',
  keepMetadata: 'Metadata',
};
const percent = (value: number) => String(Math.round(value * 1000) / 10);

function NumberField(props: {
  label: string;
  value: number;
  onChange: (value: number) => void;
  hint?: string | undefined;
}) {
  return (
    <div className="w-36">
      <TextField
        label={props.label}
        inputMode="decimal"
        value={String(props.value)}
        hint={props.hint}
        onChange={(text) => props.onChange(Number(text))}
      />
    </div>
  );
}

function RenditionFields({
  rendition,
  sources,
  onChange,
  onRemove,
}: {
  rendition: Rendition;
  sources: Partial<Record<keyof Rendition, string>> | undefined;
  onChange: (next: Rendition) => void;
  onRemove: () => void;
}) {
  const set = <K extends keyof Rendition>(key: K, value: Rendition[K]) =>
    onChange({ ...rendition, [key]: value });
  return (
    <fieldset
      className="flex flex-col gap-3 rounded-card border border-line p-3"
      aria-label={`Rendition ${rendition.name}`}
    >
      <div className="flex flex-wrap items-end gap-3">
        <div className="w-56">
          <TextField
            label="Rendition name"
            value={rendition.name}
            onChange={(value) => set('name', value)}
          />
        </div>
        <NumberField
          label="Width (px)"
          value={rendition.width}
          onChange={(value) => set('width', value)}
        />
        <NumberField
          label="Height (px)"
          value={rendition.height}
          onChange={(value) => set('height', value)}
        />
        <NumberField
          label="Eye line (% from top)"
          value={Number(percent(rendition.eyeLine))}
          onChange={(value) => set('eyeLine', value / 100)}
        />
        <NumberField
          label={
            rendition.headSize.measure === 'eye_distance'
              ? 'Eye distance (% of width)'
              : 'Eye to chin (% of width)'
          }
          value={Number(percent(rendition.headSize.fraction))}
          onChange={(value) => set('headSize', { ...rendition.headSize, fraction: value / 100 })}
        />
        <NumberField
          label="Centre (% from left)"
          value={Number(percent(rendition.centreX))}
          onChange={(value) => set('centreX', value / 100)}
        />
        <NumberField
          label="JPEG quality"
          value={rendition.jpegQuality}
          onChange={(value) => set('jpegQuality', value)}
        />
      </div>
      <div className="flex flex-wrap items-center gap-4 text-sm">
        <label className="flex min-h-touch items-center gap-2">
          Past the photo’s edge
          <select
            className="min-h-touch rounded-control border border-line-strong bg-paper-raised px-2"
            value={rendition.overflow}
            onChange={(event) => set('overflow', event.target.value as Rendition['overflow'])}
          >
            <option value="refuse">refuse the crop</option>
            <option value="extend">extend with a plain colour</option>
          </select>
        </label>
        {rendition.overflow === 'extend' ? (
          <label className="flex items-center gap-2">
            Colour
            <input
              type="color"
              value={rendition.fillColour}
              onChange={(event) => set('fillColour', event.target.value)}
            />
          </label>
        ) : null}
        <label className="flex min-h-touch items-center gap-2">
          <input
            type="checkbox"
            className="size-5"
            checked={rendition.keepMetadata.copyright}
            onChange={(event) =>
              set('keepMetadata', { ...rendition.keepMetadata, copyright: event.target.checked })
            }
          />
          Keep copyright
        </label>
        <label className="flex min-h-touch items-center gap-2">
          <input
            type="checkbox"
            className="size-5"
            checked={rendition.keepMetadata.credit}
            onChange={(event) =>
              set('keepMetadata', { ...rendition.keepMetadata, credit: event.target.checked })
            }
          />
          Keep the studio’s credit
        </label>
        <span className="text-ink-muted">Location and camera serial numbers are never kept.</span>
        <Button variant="quiet" onClick={onRemove}>
          Remove
        </Button>
      </div>
      {sources && Object.keys(sources).length > 0 ? (
        <details className="text-sm" open>
          <summary className="cursor-pointer text-spruce-700">Where these values come from</summary>
          <dl className="mt-2 grid grid-cols-[auto_1fr] gap-x-4 gap-y-1">
            {Object.entries(sources).map(([field, source]) => (
              <div key={field} className="contents">
                <dt className="font-medium">{sourceLabels[field] ?? field}</dt>
                <dd className="text-ink-muted">{source}</dd>
              </div>
            ))}
          </dl>
        </details>
      ) : null}
    </fieldset>
  );
}

/** A client's look: its renditions (from presets or by hand) and the file-name template. */
export function LookEditor({
  clientId,
  data,
  canEdit,
}: {
  clientId: string;
  data: LookResponse;
  canEdit: boolean;
}) {
  const [name, setName] = useState(data.look?.name ?? 'Staff portraits');
  const [renditions, setRenditions] = useState<Rendition[]>(data.look?.renditions ?? []);
  const [template, setTemplate] = useState(data.fileNameTemplate);
  const [message, setMessage] = useState<{ tone: 'success' | 'danger'; text: string } | null>(null);
  const save = useSaveLook(clientId);
  const preview = useNamePreview(clientId, template);
  const sourcesOf = (rendition: Rendition) =>
    data.presets.find((preset) => preset.rendition.name === rendition.name)?.sources;

  const submit = () => {
    const parsed = lookSchema.safeParse({ name, renditions });
    if (!parsed.success) {
      setMessage({ tone: 'danger', text: parsed.error.issues[0]?.message ?? 'Check the look.' });
      return;
    }
    save.mutate(
      { ...parsed.data, fileNameTemplate: template },
      {
        onSuccess: (saved) =>
          setMessage({ tone: 'success', text: `Look saved (version ${saved.version}).` }),
        onError: (error) =>
          setMessage({
            tone: 'danger',
            text: error instanceof ApiError ? error.message : 'Not saved.',
          }),
      },
    );
  };

  return (
    <fieldset disabled={!canEdit} className="flex flex-col gap-5">
      <Card title="Renditions">
        <div className="mb-3 w-72">
          <TextField label="Look name" value={name} onChange={setName} />
        </div>
        <div className="flex flex-col gap-3">
          {renditions.map((rendition, index) => (
            <RenditionFields
              key={index}
              rendition={rendition}
              sources={sourcesOf(rendition)}
              onChange={(next) =>
                setRenditions(renditions.map((each, at) => (at === index ? next : each)))
              }
              onRemove={() => setRenditions(renditions.filter((_each, at) => at !== index))}
            />
          ))}
        </div>
        <div className="mt-3 flex flex-wrap gap-2">
          {data.presets.map((preset) => (
            <Button
              key={preset.key}
              variant="secondary"
              onClick={() => setRenditions([...renditions, preset.rendition])}
            >
              Add {preset.rendition.name}
            </Button>
          ))}
        </div>
      </Card>
      <Card title="File names">
        <div className="max-w-xl">
          <TextField
            label="File-name template"
            value={template}
            onChange={setTemplate}
            hint={`Parts: ${tokens.map((token) => `{${token}}`).join(' ')}. Names become plain ASCII, safe on Windows, and unique in the set.`}
          />
        </div>
        {preview.data?.unknownTokens.length ? (
          <Notice tone="danger">
            Unknown parts: {preview.data.unknownTokens.map((token) => `{${token}}`).join(', ')}
          </Notice>
        ) : null}
        <ul className="mt-3 flex flex-col gap-1 text-sm" aria-label="File names for real people">
          {preview.data?.examples.map((example) => (
            <li key={example.name}>
              {example.name} → <span className="font-mono">{example.fileName}</span>
            </li>
          ))}
        </ul>
      </Card>
      {canEdit ? (
        <div>
          <Button onClick={submit} busy={save.isPending}>
            Save the look
          </Button>
        </div>
      ) : null}
      {message ? <Notice tone={message.tone}>{message.text}</Notice> : null}
    </fieldset>
  );
}
