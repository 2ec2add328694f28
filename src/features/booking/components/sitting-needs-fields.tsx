import type { ReactNode } from 'react';
import { TextField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';

export interface SittingNeeds {
  preferredName: string;
  glasses: boolean;
  accessNeeds: string;
  flashSensitive: boolean;
}

function Checkbox({
  label,
  checked,
  onChange,
  children,
}: {
  label: string;
  checked: boolean;
  onChange: (value: boolean) => void;
  children?: ReactNode;
}) {
  return (
    <div className="flex flex-col gap-1">
      <label className="flex min-h-touch cursor-pointer items-center gap-3">
        <input
          type="checkbox"
          checked={checked}
          onChange={(event) => onChange(event.target.checked)}
          className="size-6 accent-spruce-600"
        />
        <span>{label}</span>
      </label>
      {children}
    </div>
  );
}

/** What helps on the day: asked at booking, shown to the photographer on the day sheet. */
export function SittingNeedsFields({
  value,
  onChange,
  errors,
}: {
  value: SittingNeeds;
  onChange: (value: SittingNeeds) => void;
  errors: Record<string, string | undefined>;
}) {
  const set = <Key extends keyof SittingNeeds>(key: Key, next: SittingNeeds[Key]) =>
    onChange({ ...value, [key]: next });
  return (
    <fieldset className="flex flex-col gap-3">
      <legend className="mb-1 text-sm font-medium">What helps on the day (optional)</legend>
      <TextField
        label="Name to use on your photo files"
        hint="Leave empty to use the name on the roster."
        value={value.preferredName}
        onChange={(next) => set('preferredName', next)}
        error={errors.preferredName}
        autoComplete="nickname"
      />
      <Checkbox
        label="I wear glasses"
        checked={value.glasses}
        onChange={(next) => set('glasses', next)}
      />
      <Checkbox
        label="Flash photography is a problem for me"
        checked={value.flashSensitive}
        onChange={(next) => set('flashSensitive', next)}
      >
        <Notice tone="caution">
          For example photosensitive epilepsy. The studio will offer continuous light instead of
          flash; you do not need to say why.
        </Notice>
      </Checkbox>
      <TextField
        label="Access needs"
        hint="For example step-free access or a chair. The studio team and your company's coordinator for the day see this."
        value={value.accessNeeds}
        onChange={(next) => set('accessNeeds', next)}
        error={errors.accessNeeds}
      />
    </fieldset>
  );
}
