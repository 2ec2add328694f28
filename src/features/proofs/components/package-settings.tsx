import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import type { ProofSettingsInput } from '../../../../server/schemas/proofs';
import { Button } from '../../../components/ui/button';
import { TextField } from '../../../components/ui/field';
import { Notice } from '../../../components/ui/notice';
import { api, ApiError } from '../../../lib/api-client';

const settingsKey = (clientId: string) => ['clients', clientId, 'proof-settings'];

/** The client's package: portraits included, extras and their price, whether HR may choose. */
export function PackageSettings({ clientId }: { clientId: string }) {
  const queryClient = useQueryClient();
  const { data } = useQuery({
    queryKey: settingsKey(clientId),
    queryFn: () => api<ProofSettingsInput>(`/clients/${clientId}/proof-settings`),
  });
  const save = useMutation({
    mutationFn: (input: ProofSettingsInput) =>
      api<ProofSettingsInput>(`/clients/${clientId}/proof-settings`, {
        method: 'PUT',
        body: input,
      }),
    onSuccess: (saved) => queryClient.setQueryData(settingsKey(clientId), saved),
  });
  if (!data) return null;
  return <PackageForm key={JSON.stringify(data)} initial={data} save={save} />;
}

function PackageForm({
  initial,
  save,
}: {
  initial: ProofSettingsInput;
  save: {
    mutate: (input: ProofSettingsInput) => void;
    isPending: boolean;
    error: Error | null;
    isSuccess: boolean;
  };
}) {
  const [included, setIncluded] = useState(String(initial.picksIncluded));
  const [extra, setExtra] = useState(String(initial.extraPicksAllowed));
  const [price, setPrice] = useState((initial.extraPickPriceCents / 100).toFixed(2));
  const [hr, setHr] = useState(initial.hrMayChoose);
  return (
    <form
      className="mt-3 flex flex-col gap-3"
      aria-label="Portrait package"
      onSubmit={(event) => {
        event.preventDefault();
        save.mutate({
          picksIncluded: Number(included),
          extraPicksAllowed: Number(extra),
          extraPickPriceCents: Math.round(Number(price) * 100),
          hrMayChoose: hr,
        });
      }}
    >
      <div className="flex flex-wrap gap-3">
        <div className="w-40">
          <TextField
            label="Portraits included"
            type="number"
            min={1}
            max={20}
            value={included}
            onChange={setIncluded}
          />
        </div>
        <div className="w-40">
          <TextField
            label="Extra picks allowed"
            type="number"
            min={0}
            max={20}
            value={extra}
            onChange={setExtra}
          />
        </div>
        <div className="w-40">
          <TextField
            label="Price per extra (£)"
            inputMode="decimal"
            value={price}
            onChange={setPrice}
          />
        </div>
      </div>
      <label className="flex min-h-touch items-center gap-2">
        <input
          type="checkbox"
          className="size-5"
          checked={hr}
          onChange={(event) => setHr(event.target.checked)}
        />
        HR may choose portraits for staff
      </label>
      <div>
        <Button type="submit" variant="secondary" busy={save.isPending}>
          Save the package
        </Button>
      </div>
      {save.error ? (
        <Notice tone="danger">
          {save.error instanceof ApiError ? save.error.message : 'Not saved.'}
        </Notice>
      ) : save.isSuccess ? (
        <Notice tone="success">Package saved.</Notice>
      ) : null}
    </form>
  );
}
