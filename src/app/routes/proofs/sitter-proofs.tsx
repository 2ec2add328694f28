import type { QueryClient } from '@tanstack/react-query';
import { useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { Notice } from '../../../components/ui/notice';
import { PageHeading } from '../../../components/ui/page-heading';
import { proofsQueryOptions, useProofs } from '../../../features/proofs/api/sitter-proofs';
import { ProofPicker } from '../../../features/proofs/components/proof-picker';
import { requireRole } from '../../guards';

export const makeLoader =
  (queryClient: QueryClient) =>
  async ({ request, params }: LoaderFunctionArgs) => {
    await requireRole(queryClient, request, ['sitter']);
    await queryClient.prefetchQuery(proofsQueryOptions(params.dayId ?? ''));
    return null;
  };

/** The sitter's own proofs, phone first. */
export function SitterProofsPage() {
  const { dayId = '' } = useParams();
  const proofs = useProofs(dayId);
  if (proofs.isPending) return <p role="status">Loading your proofs…</p>;
  if (proofs.isError) return <Notice tone="danger">{proofs.error.message}</Notice>;
  return (
    <div className="mx-auto flex max-w-xl flex-col gap-4">
      <PageHeading title="Choose your portrait">
        {proofs.data.clientName} · photographed {proofs.data.date}. These are proofs: the mark
        across them goes once the portrait is finished.
      </PageHeading>
      <ProofPicker proofs={proofs.data} />
    </div>
  );
}
