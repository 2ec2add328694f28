import type { CardLight } from '../../../../server/schemas/setup-card';
import { SelectField, TextField } from '../../../components/ui/field';
import { powerSettings } from '../model/power-scale';
import { NumberInput } from './number-input';

const roleNames: Record<CardLight['role'], string> = {
  key: 'Key light',
  fill: 'Fill light',
  background: 'Background light',
  hair: 'Hair light',
};

export function LightFields(props: {
  light: CardLight;
  errors: Record<string, string>;
  path: string;
  onChange: (light: CardLight) => void;
  onRemove?: () => void;
}) {
  const { light, errors, path, onChange } = props;
  const set = <Key extends keyof CardLight>(key: Key, value: CardLight[Key]) =>
    onChange({ ...light, [key]: value });
  const nearest = powerSettings.reduce((best, setting) =>
    Math.abs(Math.log2(setting.fraction / light.power)) <
    Math.abs(Math.log2(best.fraction / light.power))
      ? setting
      : best,
  );
  return (
    <fieldset className="rounded-control border border-line p-3">
      <legend className="px-1 font-semibold">{roleNames[light.role]}</legend>
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField
          label="Power"
          value={String(nearest.fraction)}
          options={powerSettings.map((setting) => ({
            value: String(setting.fraction),
            label: setting.label,
          }))}
          onChange={(value) => set('power', Number(value))}
          error={errors[`${path}.power`]}
        />
        <NumberInput
          label={light.role === 'background' ? 'Distance to background' : 'Distance to sitter'}
          unit="m"
          value={light.distanceMetres}
          onChange={(value) => set('distanceMetres', value ?? Number.NaN)}
          error={errors[`${path}.distanceMetres`]}
        />
        <TextField
          label="Modifier"
          value={light.modifier}
          onChange={(value) => set('modifier', value)}
          error={errors[`${path}.modifier`]}
        />
        <NumberInput
          label="Modifier loss"
          unit="stops, if known"
          allowEmpty
          value={light.modifierLossStops}
          onChange={(value) => set('modifierLossStops', value)}
          error={errors[`${path}.modifierLossStops`]}
        />
        <NumberInput
          label="Guide number"
          unit="m, full power at ISO 100, optional"
          allowEmpty
          value={light.guideNumber}
          onChange={(value) => set('guideNumber', value)}
          error={errors[`${path}.guideNumber`]}
        />
      </div>
      {props.onRemove ? (
        <button
          type="button"
          onClick={props.onRemove}
          className="mt-2 min-h-touch text-sm font-medium text-danger-700 underline"
        >
          Remove the {roleNames[light.role].toLowerCase()}
        </button>
      ) : null}
    </fieldset>
  );
}
