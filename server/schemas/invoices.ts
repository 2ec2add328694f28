import { z } from 'zod';

/** ISO 4217 codes this runtime's Intl knows (CLDR's list), so each has a known minor unit. */
const knownCurrencies = new Set(Intl.supportedValuesOf('currency'));

export const currencySchema = z
  .string({ error: 'Give the currency as a three-letter code, like GBP or EUR.' })
  .trim()
  .toUpperCase()
  .regex(/^[A-Z]{3}$/, {
    error: 'Give the currency as a three-letter code, like GBP or EUR.',
    abort: true,
  })
  .refine((code) => knownCurrencies.has(code), { error: 'That is not an ISO 4217 currency.' });

/** Digits after the decimal point in the currency's minor unit (GBP 2, JPY 0, BHD 3). */
export function currencyExponent(currency: string): number {
  return (
    new Intl.NumberFormat('en', { style: 'currency', currency }).resolvedOptions()
      .maximumFractionDigits ?? 2
  );
}

/** Minor units as a plain decimal, for CSV and form fields: 123456 GBP → "1234.56". */
export function minorToDecimal(minor: number, currency: string): string {
  const exponent = currencyExponent(currency);
  const sign = minor < 0 ? '-' : '';
  const digits = String(Math.abs(minor)).padStart(exponent + 1, '0');
  if (exponent === 0) return sign + digits;
  return `${sign}${digits.slice(0, -exponent)}.${digits.slice(-exponent)}`;
}

/** "1234.5" → 123450 for GBP, without floating point; null when it is not a plain amount. */
export function decimalToMinor(text: string, currency: string): number | null {
  const exponent = currencyExponent(currency);
  const match = /^(\d{1,9})(?:\.(\d*))?$/.exec(text.trim());
  if (!match) return null;
  const fraction = match[2] ?? '';
  if (fraction.length > exponent) return null;
  return Number(match[1]) * 10 ** exponent + Number(fraction.padEnd(exponent, '0') || '0');
}

/** For people: "£1,234.56". */
export function formatMoney(minor: number, currency: string, locale = 'en-GB'): string {
  const exponent = currencyExponent(currency);
  return new Intl.NumberFormat(locale, { style: 'currency', currency }).format(
    minor / 10 ** exponent,
  );
}

/** 2000 basis points → "20%"; 1750 → "17.5%". */
export function formatTaxRate(basisPoints: number): string {
  return `${(basisPoints / 100).toFixed(2).replace(/\.?0+$/, '')}%`;
}

export const maxPriceMinor = 100_000_000;

const priceField = (label: string) =>
  z
    .number({ error: `Give the ${label} as a whole number of minor units.` })
    .int({ error: `Give the ${label} as a whole number of minor units.` })
    .min(0, { error: 'A price cannot be negative.' })
    .max(maxPriceMinor, { error: 'That price is too large.' });

/** The client's price list: amounts in the currency's minor unit, tax in basis points. */
export const priceListSchema = z
  .object({
    currency: currencySchema,
    dayRateMinor: priceField('day rate'),
    perStationMinor: priceField('price per station'),
    perPersonMinor: priceField('price per person photographed'),
    perExtraPickMinor: priceField('price per extra pick'),
    perRetouchMinor: priceField('price per retouch'),
    perExtraRenditionMinor: priceField('price per extra rendition'),
    renditionsIncluded: z
      .number({ error: 'Give a number of renditions.' })
      .int({ error: 'Give a whole number of renditions.' })
      .min(0, { error: 'Renditions included cannot be negative.' })
      .max(50, { error: 'At most 50 renditions.' }),
    taxRateBasisPoints: z
      .number({ error: 'Give the tax rate in basis points (20% is 2000).' })
      .int({ error: 'Give the tax rate in whole basis points (20% is 2000).' })
      .min(0, { error: 'A tax rate cannot be negative.' })
      .max(10_000, { error: 'A tax rate is at most 100%.' }),
  })
  .strict();
export type PriceListInput = z.output<typeof priceListSchema>;
export type PriceList = PriceListInput;

/** The price list, or what the form starts from when none is saved yet (saved: false). */
export interface PriceListAnswer {
  saved: boolean;
  updatedAt: string | null;
  priceList: PriceList;
}

/** A day's figures, every one read from the day's own records. */
export interface DayCounts {
  invited: number;
  booked: number;
  checkedIn: number;
  walkIns: number;
  photographed: number;
  noShows: number;
  /** Invited (on the day's roster) and never photographed. */
  missed: number;
  picks: number;
  /** Picks beyond the package's portraits included, per person. */
  extraPicks: number;
  retouchesDone: number;
  renditionsDelivered: number;
  /** Renditions beyond the price list's renditions included, per person. */
  extraRenditions: number;
  stations: number;
}

export const countLabels: Record<keyof DayCounts, string> = {
  invited: 'Invited',
  booked: 'Booked',
  checkedIn: 'Checked in',
  walkIns: 'Walk-ins',
  photographed: 'Photographed',
  noShows: 'No-shows',
  missed: 'Missed',
  picks: 'Picks',
  extraPicks: 'Extra picks',
  retouchesDone: 'Retouches done',
  renditionsDelivered: 'Renditions delivered',
  extraRenditions: 'Extra renditions',
  stations: 'Stations',
};

export interface OfficeFigures {
  label: string;
  invited: number;
  booked: number;
  photographed: number;
}

export type InvoiceLineKind =
  'day_rate' | 'stations' | 'people' | 'extra_picks' | 'retouches' | 'extra_renditions';

export interface InvoiceLine {
  kind: InvoiceLineKind;
  description: string;
  quantity: number;
  unitMinor: number;
  amountMinor: number;
}

export interface InvoiceTotals {
  currency: string;
  lines: InvoiceLine[];
  subtotalMinor: number;
  taxRateBasisPoints: number;
  taxMinor: number;
  totalMinor: number;
}

export interface InvoiceRef {
  id: string;
  number: string;
  issuedAt: string;
}

export interface DaySummary {
  dayId: string;
  clientId: string;
  clientName: string;
  officeName: string;
  date: string;
  counts: DayCounts;
  byOffice: OfficeFigures[];
  /** What the invoice would say with today's price list; null without a saved price list. */
  draft: InvoiceTotals | null;
  invoice: InvoiceRef | null;
}

export interface ClientSummary {
  clientId: string;
  clientName: string;
  totals: DayCounts;
  days: Array<{
    dayId: string;
    officeName: string;
    date: string;
    counts: DayCounts;
    invoice: InvoiceRef | null;
  }>;
}

/** Who issues the invoice: the studio, as configured when it was issued. */
export interface InvoiceIssuer {
  name: string;
  address: string;
  taxId: string;
}

/** Everything an issued invoice prints, frozen when it was issued. */
export interface InvoiceSnapshot extends InvoiceTotals {
  /** Absent on invoices issued before the issuer was printed. */
  issuer?: InvoiceIssuer;
  clientName: string;
  officeName: string;
  dayDate: string;
  counts: DayCounts;
  priceList: PriceList;
}

export interface Invoice extends InvoiceSnapshot {
  id: string;
  number: string;
  dayId: string;
  clientId: string;
  issuedAt: string;
}

/** Issuing takes no options: the invoice comes from the day's records and the price list. */
export const issueInvoiceRequestSchema = z.object({}).strict();
