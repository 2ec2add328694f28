import type {
  DayCounts,
  InvoiceLine,
  InvoiceLineKind,
  InvoiceTotals,
  PriceList,
} from '../../schemas/invoices';

/**
 * Tax on an amount in minor units at a rate in basis points, worked out once on the invoice's
 * subtotal and rounded half up to the minor unit (round half up: common practice in
 * invoicing). Integer arithmetic throughout (BigInt), so no amount is ever a binary fraction:
 * tax = floor((amount × rate + 5000) / 10000). Amounts here are never negative.
 */
export function taxHalfUp(amountMinor: number, basisPoints: number): number {
  const product = BigInt(amountMinor) * BigInt(basisPoints);
  return toSafeNumber((product + 5_000n) / 10_000n);
}

function toSafeNumber(value: bigint): number {
  if (value > BigInt(Number.MAX_SAFE_INTEGER)) throw new RangeError('Amount out of range.');
  return Number(value);
}

const plural = (count: number, one: string, many: string) => (count === 1 ? one : many);

/**
 * A day's counts and the client's price list as invoice lines, subtotal, tax and total.
 * A line whose quantity is 0 is left out; the day rate is always one line.
 */
export function invoiceLines(counts: DayCounts, prices: PriceList): InvoiceTotals {
  const wanted: Array<[InvoiceLineKind, number, number, string]> = [
    ['day_rate', 1, prices.dayRateMinor, 'Shoot day'],
    [
      'stations',
      counts.stations,
      prices.perStationMinor,
      plural(counts.stations, 'Station', 'Stations'),
    ],
    [
      'people',
      counts.photographed,
      prices.perPersonMinor,
      plural(counts.photographed, 'Person photographed', 'People photographed'),
    ],
    [
      'extra_picks',
      counts.extraPicks,
      prices.perExtraPickMinor,
      plural(counts.extraPicks, 'Extra pick', 'Extra picks'),
    ],
    [
      'retouches',
      counts.retouchesDone,
      prices.perRetouchMinor,
      plural(counts.retouchesDone, 'Retouch', 'Retouches'),
    ],
    [
      'extra_renditions',
      counts.extraRenditions,
      prices.perExtraRenditionMinor,
      plural(counts.extraRenditions, 'Extra rendition', 'Extra renditions'),
    ],
  ];
  const lines: InvoiceLine[] = wanted
    .filter(([, quantity]) => quantity > 0)
    .map(([kind, quantity, unitMinor, description]) => ({
      kind,
      description,
      quantity,
      unitMinor,
      amountMinor: toSafeNumber(BigInt(quantity) * BigInt(unitMinor)),
    }));
  const subtotalMinor = toSafeNumber(
    lines.reduce((sum, line) => sum + BigInt(line.amountMinor), 0n),
  );
  const taxMinor = taxHalfUp(subtotalMinor, prices.taxRateBasisPoints);
  return {
    currency: prices.currency,
    lines,
    subtotalMinor,
    taxRateBasisPoints: prices.taxRateBasisPoints,
    taxMinor,
    totalMinor: subtotalMinor + taxMinor,
  };
}

/** LK-2027-0001: the year of issue and that year's sequence, four digits or more. */
export function invoiceNumber(year: number, sequence: number): string {
  return `LK-${year}-${String(sequence).padStart(4, '0')}`;
}
