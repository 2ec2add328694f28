import { useState } from 'react';
import {
  currencyExponent,
  currencySchema,
  decimalToMinor,
  minorToDecimal,
  priceListSchema,
  type PriceList,
} from '../../../../server/schemas/invoices';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { ApiError } from '../../../lib/api-client';
import { usePriceList } from '../api/get-price-list';
import { useSavePriceList } from '../api/save-price-list';

const amountFields = [
  ['dayRateMinor', 'Day rate'],
  ['perStationMinor', 'Per station'],
  ['perPersonMinor', 'Per person photographed'],
  ['perExtraPickMinor', 'Per extra pick'],
  ['perRetouchMinor', 'Per retouch'],
  ['perExtraRenditionMinor', 'Per extra rendition'],
] as const;
type AmountField = (typeof amountFields)[number][0];

/** "17.5" (%) → 1750 basis points, without floating point; null if it is not a rate. */
function percentToBasisPoints(text: string): number | null {
  const match = /^(\d{1,3})(?:\.(\d{1,2}))?$/.exec(text.trim());
  if (!match) return null;
  return Number(match[1]) * 100 + Number((match[2] ?? '').padEnd(2, '0'));
}

/** The client's price list (studio admin): amounts typed in the currency, tax as a percent. */
export function PriceListForm({ clientId }: { clientId: string }) {
  const { data } = usePriceList(clientId);
  // Outside the form, which starts afresh from what was saved, so the outcome stays shown.
  const save = useSavePriceList(clientId);
  if (!data) return null;
  return <Form key={data.updatedAt ?? 'new'} save={save} initial={data.priceList} />;
}

function Form({
  save,
  initial,
}: {
  save: ReturnType<typeof useSavePriceList>;
  initial: PriceList;
}) {
  const [currency, setCurrency] = useState(initial.currency);
  const [amounts, setAmounts] = useState<Record<AmountField, string>>(
    () =>
      Object.fromEntries(
        amountFields.map(([key]) => [key, minorToDecimal(initial[key], initial.currency)]),
      ) as Record<AmountField, string>,
  );
  const [included, setIncluded] = useState(String(initial.renditionsIncluded));
  const [tax, setTax] = useState(String(initial.taxRateBasisPoints / 100));
  const [errors, setErrors] = useState<Record<string, string | undefined>>({});
  const serverErrors = save.error instanceof ApiError ? save.error.fieldErrors : {};
  const errorOf = (key: string) => errors[key] ?? serverErrors[key]?.[0];

  const submit = () => {
    const found: Record<string, string> = {};
    const code = currencySchema.safeParse(currency);
    if (!code.success) found.currency = code.error.issues[0]?.message ?? 'Check the currency.';
    const unit = code.success ? code.data : 'GBP';
    const digits = currencyExponent(unit);
    const parsed: Partial<Record<AmountField, number>> = {};
    for (const [key] of amountFields) {
      const minor = decimalToMinor(amounts[key], unit);
      if (minor === null) {
        found[key] =
          digits === 0
            ? `Give a whole amount in ${unit}.`
            : `Give an amount like 12.50, at most ${digits} digits after the point.`;
      } else parsed[key] = minor;
    }
    const basisPoints = percentToBasisPoints(tax);
    if (basisPoints === null) found.taxRateBasisPoints = 'Give the tax rate as a percent, like 20.';
    if (Object.keys(found).length > 0) return setErrors(found);
    const checked = priceListSchema.safeParse({
      currency: unit,
      ...parsed,
      renditionsIncluded: Number(included),
      taxRateBasisPoints: basisPoints,
    });
    if (!checked.success) {
      return setErrors(
        Object.fromEntries(checked.error.issues.map((issue) => [issue.path[0], issue.message])),
      );
    }
    setErrors({});
    save.mutate(checked.data);
  };

  return (
    <form
      className="mt-3 flex flex-col gap-3"
      aria-label="Price list"
      onSubmit={(event) => {
        event.preventDefault();
        submit();
      }}
    >
      <div className="grid gap-3 sm:grid-cols-3">
        <TextField
          label="Currency (ISO 4217)"
          value={currency}
          maxLength={3}
          autoCapitalize="characters"
          onChange={setCurrency}
          error={errorOf('currency')}
        />
        {amountFields.map(([key, label]) => (
          <TextField
            key={key}
            label={`${label} (${currency.toUpperCase() || 'amount'})`}
            inputMode="decimal"
            value={amounts[key]}
            onChange={(value) => setAmounts((current) => ({ ...current, [key]: value }))}
            error={errorOf(key)}
          />
        ))}
        <TextField
          label="Renditions included per person"
          type="number"
          min={0}
          max={50}
          value={included}
          onChange={setIncluded}
          error={errorOf('renditionsIncluded')}
        />
        <TextField
          label="Tax rate (%)"
          inputMode="decimal"
          value={tax}
          onChange={setTax}
          error={errorOf('taxRateBasisPoints')}
        />
      </div>
      <div>
        <Button type="submit" variant="secondary" busy={save.isPending}>
          Save the price list
        </Button>
      </div>
      {save.error ? (
        <Notice tone="danger">{save.error.message}</Notice>
      ) : save.isSuccess ? (
        <Notice tone="success">Price list saved.</Notice>
      ) : null}
    </form>
  );
}
