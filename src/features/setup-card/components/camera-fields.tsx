import type { SetupCard } from '../../../../server/schemas/setup-card';
import { SelectField } from '../../../components/ui/field';
import { shutterChoices, shutterLabel } from '../model/starter-card';
import { NumberInput } from './number-input';

type Camera = SetupCard['camera'];

const formats: Array<{ value: Camera['sensorFormat']; label: string }> = [
  { value: 'full_frame', label: 'Full frame' },
  { value: 'aps_c_15', label: 'APS-C (1.5× crop)' },
  { value: 'aps_c_16', label: 'APS-C (1.6× crop)' },
  { value: 'micro_four_thirds', label: 'Micro Four Thirds (2× crop)' },
  { value: 'custom', label: 'Other crop factor' },
];

export function CameraFields({
  camera,
  errors,
  onChange,
}: {
  camera: Camera;
  errors: Record<string, string>;
  onChange: (camera: Camera) => void;
}) {
  const set = <Key extends keyof Camera>(key: Key, value: Camera[Key]) =>
    onChange({ ...camera, [key]: value });
  const shutterOptions = shutterChoices.map((seconds) => ({
    value: String(seconds),
    label: shutterLabel(seconds),
  }));
  return (
    <fieldset className="rounded-control border border-line p-3">
      <legend className="px-1 font-semibold">Camera</legend>
      <div className="grid gap-3 sm:grid-cols-2">
        <SelectField
          label="Sensor format"
          value={camera.sensorFormat}
          options={formats}
          onChange={(value) => set('sensorFormat', value as Camera['sensorFormat'])}
        />
        {camera.sensorFormat === 'custom' ? (
          <NumberInput
            label="Crop factor"
            allowEmpty
            value={camera.customCropFactor}
            onChange={(value) => set('customCropFactor', value)}
            error={errors['camera.customCropFactor']}
          />
        ) : null}
        <NumberInput
          label="Focal length"
          unit="mm"
          value={camera.focalLengthMm}
          onChange={(value) => set('focalLengthMm', value ?? Number.NaN)}
          error={errors['camera.focalLengthMm']}
        />
        <NumberInput
          label="Aperture"
          unit="f-number"
          value={camera.aperture}
          onChange={(value) => set('aperture', value ?? Number.NaN)}
          error={errors['camera.aperture']}
        />
        <SelectField
          label="Shutter speed"
          value={String(camera.shutterSeconds)}
          options={shutterOptions}
          onChange={(value) => set('shutterSeconds', Number(value))}
        />
        <SelectField
          label="Body's flash sync speed"
          value={String(camera.flashSyncSeconds)}
          options={shutterOptions}
          onChange={(value) => set('flashSyncSeconds', Number(value))}
        />
        <NumberInput
          label="ISO"
          value={camera.iso}
          onChange={(value) => set('iso', value ?? Number.NaN)}
          error={errors['camera.iso']}
        />
        <NumberInput
          label="Camera to sitter"
          unit="m"
          value={camera.cameraToSitterMetres}
          onChange={(value) => set('cameraToSitterMetres', value ?? Number.NaN)}
          error={errors['camera.cameraToSitterMetres']}
        />
        <NumberInput
          label="Sitter to background"
          unit="m"
          value={camera.sitterToBackgroundMetres}
          onChange={(value) => set('sitterToBackgroundMetres', value ?? Number.NaN)}
          error={errors['camera.sitterToBackgroundMetres']}
        />
      </div>
    </fieldset>
  );
}
