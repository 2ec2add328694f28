/**
 * Time-zone names as the IANA database spells them today. Browsers and Node list zones through
 * ICU (`Intl.supportedValuesOf('timeZone')`), which keeps some retired spellings as its canonical
 * ids (Asia/Calcutta, Europe/Kiev). We show the current name and accept the old one as an alias:
 * both resolve to the same zone rules, so a stored old name keeps working.
 */
export const renamedZones: Readonly<Record<string, string>> = {
  'Africa/Asmera': 'Africa/Asmara',
  'America/Buenos_Aires': 'America/Argentina/Buenos_Aires',
  'America/Catamarca': 'America/Argentina/Catamarca',
  'America/Coral_Harbour': 'America/Atikokan',
  'America/Cordoba': 'America/Argentina/Cordoba',
  'America/Godthab': 'America/Nuuk',
  'America/Indianapolis': 'America/Indiana/Indianapolis',
  'America/Jujuy': 'America/Argentina/Jujuy',
  'America/Louisville': 'America/Kentucky/Louisville',
  'America/Mendoza': 'America/Argentina/Mendoza',
  'Asia/Calcutta': 'Asia/Kolkata',
  'Asia/Katmandu': 'Asia/Kathmandu',
  'Asia/Rangoon': 'Asia/Yangon',
  'Asia/Saigon': 'Asia/Ho_Chi_Minh',
  'Atlantic/Faeroe': 'Atlantic/Faroe',
  'Europe/Kiev': 'Europe/Kyiv',
  'Pacific/Enderbury': 'Pacific/Kanton',
  'Pacific/Ponape': 'Pacific/Pohnpei',
  'Pacific/Truk': 'Pacific/Chuuk',
};

/** The current IANA name of a zone given by any of its names (an alias maps to its new name). */
export function currentZoneName(zone: string): string {
  return renamedZones[zone] ?? zone;
}

const fallbackZones = [
  'Europe/London',
  'Europe/Amsterdam',
  'Europe/Lisbon',
  'Europe/Berlin',
  'UTC',
];

/** Every zone the runtime knows, under its current name, sorted, each once. */
export function currentTimeZones(
  known: readonly string[] = typeof Intl.supportedValuesOf === 'function'
    ? Intl.supportedValuesOf('timeZone')
    : fallbackZones,
): string[] {
  return [...new Set(known.map(currentZoneName))].sort((a, b) => a.localeCompare(b));
}
