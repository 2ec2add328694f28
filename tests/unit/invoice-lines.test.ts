import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  invoiceLines,
  invoiceNumber,
  taxHalfUp,
} from '../../server/modules/invoices/invoice-lines';
import {
  decimalToMinor,
  formatMoney,
  formatTaxRate,
  minorToDecimal,
  priceListSchema,
  type DayCounts,
  type PriceList,
} from '../../server/schemas/invoices';

const counts = (overrides: Partial<DayCounts>): DayCounts => ({
  invited: 0,
  booked: 0,
  checkedIn: 0,
  walkIns: 0,
  photographed: 0,
  noShows: 0,
  missed: 0,
  picks: 0,
  extraPicks: 0,
  retouchesDone: 0,
  renditionsDelivered: 0,
  extraRenditions: 0,
  stations: 0,
  ...overrides,
});

const prices: PriceList = {
  currency: 'GBP',
  dayRateMinor: 95_000, // £950.00
  perStationMinor: 12_500, // £125.00
  perPersonMinor: 1_850, // £18.50
  perExtraPickMinor: 1_200, // £12.00
  perRetouchMinor: 2_250, // £22.50
  perExtraRenditionMinor: 298, // £2.98
  renditionsIncluded: 2,
  taxRateBasisPoints: 1_750, // 17.5%
};

describe('invoice lines', () => {
  it('works out a day by hand: lines, subtotal, tax rounded half up, total', () => {
    const day = counts({
      stations: 2,
      photographed: 37,
      extraPicks: 3,
      retouchesDone: 12,
      extraRenditions: 5,
    });
    // By hand, in pence:
    //   Shoot day          1 × 95000 =  95000
    //   Stations           2 × 12500 =  25000
    //   People photographed 37 × 1850 = 68450
    //   Extra picks        3 ×  1200 =   3600
    //   Retouches         12 ×  2250 =  27000
    //   Extra renditions   5 ×   298 =   1490
    //   Subtotal 95000 + 25000 + 68450 + 3600 + 27000 + 1490 = 220540
    //   Tax 17.5%: 220540 × 1750 / 10000 = 385945000 / 10000 = 38594.5 → half up 38595
    //   Total 220540 + 38595 = 259135 (£2,591.35)
    expect(invoiceLines(day, prices)).toEqual({
      currency: 'GBP',
      lines: [
        {
          kind: 'day_rate',
          description: 'Shoot day',
          quantity: 1,
          unitMinor: 95000,
          amountMinor: 95000,
        },
        {
          kind: 'stations',
          description: 'Stations',
          quantity: 2,
          unitMinor: 12500,
          amountMinor: 25000,
        },
        {
          kind: 'people',
          description: 'People photographed',
          quantity: 37,
          unitMinor: 1850,
          amountMinor: 68450,
        },
        {
          kind: 'extra_picks',
          description: 'Extra picks',
          quantity: 3,
          unitMinor: 1200,
          amountMinor: 3600,
        },
        {
          kind: 'retouches',
          description: 'Retouches',
          quantity: 12,
          unitMinor: 2250,
          amountMinor: 27000,
        },
        {
          kind: 'extra_renditions',
          description: 'Extra renditions',
          quantity: 5,
          unitMinor: 298,
          amountMinor: 1490,
        },
      ],
      subtotalMinor: 220540,
      taxRateBasisPoints: 1750,
      taxMinor: 38595,
      totalMinor: 259135,
    });
    expect(formatMoney(259135, 'GBP')).toBe('£2,591.35');
  });

  it('leaves out lines with nothing to charge for, but always bills the day', () => {
    const result = invoiceLines(counts({ stations: 1, photographed: 1 }), {
      ...prices,
      taxRateBasisPoints: 2000,
    });
    expect(result.lines.map((line) => [line.description, line.quantity])).toEqual([
      ['Shoot day', 1],
      ['Station', 1],
      ['Person photographed', 1],
    ]);
    // 95000 + 12500 + 1850 = 109350; 20% = 21870 exactly.
    expect([result.subtotalMinor, result.taxMinor, result.totalMinor]).toEqual([
      109350, 21870, 131220,
    ]);
  });

  it('rounds tax half up to the minor unit', () => {
    expect(taxHalfUp(1, 5000)).toBe(1); // 0.5 → 1
    expect(taxHalfUp(1, 4999)).toBe(0); // 0.4999 → 0
    expect(taxHalfUp(3, 1666)).toBe(0); // 0.4998 → 0
    expect(taxHalfUp(3, 1667)).toBe(1); // 0.5001 → 1
    expect(taxHalfUp(0, 2000)).toBe(0);
    expect(taxHalfUp(10_001, 10_000)).toBe(10_001);
  });

  it('agrees with rounding by quotient and remainder, for any amount and rate', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 5_000_000_000 }),
        fc.integer({ min: 0, max: 10_000 }),
        (amount, rate) => {
          const product = BigInt(amount) * BigInt(rate);
          const quotient = product / 10_000n;
          const remainder = product % 10_000n;
          const expected = Number(quotient + (remainder * 2n >= 10_000n ? 1n : 0n));
          expect(taxHalfUp(amount, rate)).toBe(expected);
        },
      ),
    );
  });

  it('numbers invoices per year with four digits or more', () => {
    expect(invoiceNumber(2027, 1)).toBe('LK-2027-0001');
    expect(invoiceNumber(2027, 12_345)).toBe('LK-2027-12345');
  });
});

describe('money in minor units', () => {
  it('knows each currency’s minor unit (ISO 4217)', () => {
    expect(minorToDecimal(123456, 'GBP')).toBe('1234.56');
    expect(minorToDecimal(5, 'EUR')).toBe('0.05');
    expect(minorToDecimal(1500, 'JPY')).toBe('1500');
    expect(minorToDecimal(1500, 'BHD')).toBe('1.500');
    expect(decimalToMinor('1234.5', 'GBP')).toBe(123450);
    expect(decimalToMinor('12', 'EUR')).toBe(1200);
    expect(decimalToMinor('1500', 'JPY')).toBe(1500);
    expect(decimalToMinor('1.5', 'JPY')).toBeNull();
    expect(decimalToMinor('1.234', 'GBP')).toBeNull();
    expect(decimalToMinor('-1', 'GBP')).toBeNull();
    expect(decimalToMinor('1,000', 'GBP')).toBeNull();
    expect(formatTaxRate(2000)).toBe('20%');
    expect(formatTaxRate(1750)).toBe('17.5%');
    expect(formatTaxRate(0)).toBe('0%');
  });

  it('accepts a price list and names what is wrong with a bad one', () => {
    expect(priceListSchema.parse({ ...prices, currency: 'eur' }).currency).toBe('EUR');
    const bad = priceListSchema.safeParse({
      ...prices,
      currency: 'XYZ',
      dayRateMinor: 10.5,
      perPersonMinor: -1,
      taxRateBasisPoints: 10_001,
    });
    expect(bad.success).toBe(false);
    const fields = bad.error!.issues.map((issue) => issue.path.join('.')).sort();
    expect(fields).toEqual(['currency', 'dayRateMinor', 'perPersonMinor', 'taxRateBasisPoints']);
  });
});
