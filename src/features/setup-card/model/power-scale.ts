/** Flash power settings from full down to 1/128, in full stops and thirds. */
export interface PowerSetting {
  /** Stops below full power: 0, 1/3, 2/3, 1, ... 7. */
  stopsBelowFull: number;
  /** Fraction of full power. */
  fraction: number;
  label: string;
}

const FULL_STOPS = 7;

function label(stopsBelowFull: number): string {
  const whole = Math.floor(stopsBelowFull + 1e-9);
  const thirds = Math.round((stopsBelowFull - whole) * 3);
  const base = whole === 0 ? '1/1' : `1/${2 ** whole}`;
  // Thirds below a full stop are written as that stop minus thirds, as flash units display them.
  if (thirds === 0) return base;
  const next = `1/${2 ** (whole + 1)}`;
  return `${next} +${((3 - thirds) / 3).toFixed(1)}`;
}

export const powerSettings: PowerSetting[] = Array.from(
  { length: FULL_STOPS * 3 + 1 },
  (_, index) => {
    const stopsBelowFull = index / 3;
    return { stopsBelowFull, fraction: 2 ** -stopsBelowFull, label: label(stopsBelowFull) };
  },
);

export function powerLabel(fraction: number): string {
  const match = powerSettings.find(
    (setting) => Math.abs(setting.fraction - fraction) / fraction < 1e-6,
  );
  return match?.label ?? `${(fraction * 100).toPrecision(3)} %`;
}
