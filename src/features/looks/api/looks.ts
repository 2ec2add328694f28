import {
  keepPreviousData,
  queryOptions,
  useMutation,
  useQuery,
  useQueryClient,
} from '@tanstack/react-query';
import type { Look, Rendition } from '../../../../server/schemas/looks';
import { api } from '../../../lib/api-client';

export interface LookResponse {
  look: Look | null;
  fileNameTemplate: string;
  version: number;
  presets: Array<{
    key: string;
    rendition: Rendition;
    sources: Partial<Record<keyof Rendition, string>>;
  }>;
}

export interface DaySet {
  dayId: string;
  clientName: string;
  dayDate: string;
  lookVersion: number | null;
  renditions: Array<{ name: string; width: number; height: number; eyeLine: number }>;
  sitters: Array<{
    pickId: string;
    personId: string;
    name: string;
    employeeId: string | null;
    fileName: string;
    hasFinal: boolean;
    eyes: {
      status: string;
      left: { x: number; y: number } | null;
      right: { x: number; y: number } | null;
      imageWidth: number | null;
      imageHeight: number | null;
    } | null;
    needsAHand: boolean;
    renditions: Array<{ name: string; status: string; refusal: string | null }>;
  }>;
}

export const lookQueryOptions = (clientId: string) =>
  queryOptions({
    queryKey: ['clients', clientId, 'look'],
    queryFn: () => api<LookResponse>(`/clients/${clientId}/look`),
  });
export const useLook = (clientId: string) => useQuery(lookQueryOptions(clientId));

export function useSaveLook(clientId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: Look & { fileNameTemplate: string }) =>
      api<{ version: number }>(`/clients/${clientId}/look`, { method: 'PUT', body: input }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: ['clients', clientId, 'look'] }),
  });
}

export const useNamePreview = (clientId: string, template: string) =>
  useQuery({
    queryKey: ['clients', clientId, 'look', 'names', template],
    queryFn: () =>
      api<{ unknownTokens: string[]; examples: Array<{ name: string; fileName: string }> }>(
        `/clients/${clientId}/look/names?template=${encodeURIComponent(template)}`,
      ),
    enabled: template.trim().length > 0,
    placeholderData: keepPreviousData,
  });

export const daySetQueryOptions = (dayId: string) =>
  queryOptions({
    queryKey: ['days', dayId, 'set'],
    queryFn: () => api<DaySet>(`/days/${dayId}/set`),
    // While renditions are being made, look again every three seconds.
    refetchInterval: (query) =>
      query.state.data?.sitters.some(
        (sitter) =>
          !sitter.needsAHand && sitter.renditions.some((each) => each.status === 'waiting'),
      )
        ? 3000
        : false,
  });
export const useDaySet = (dayId: string) => useQuery(daySetQueryOptions(dayId));

function useSetMutation<Input, Output>(dayId: string, send: (input: Input) => Promise<Output>) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: send,
    onSettled: async () => {
      await queryClient.invalidateQueries({ queryKey: ['days', dayId, 'set'] });
      await queryClient.invalidateQueries({ queryKey: ['days', dayId, 'delivery'] });
    },
  });
}

export const usePrepareSet = (dayId: string) =>
  useSetMutation(dayId, () =>
    api<{ queued: number }>(`/days/${dayId}/set/prepare`, { method: 'POST' }),
  );

export const useMarkEyes = (dayId: string) =>
  useSetMutation(
    dayId,
    (input: {
      pickId: string;
      leftEye: { x: number; y: number };
      rightEye: { x: number; y: number };
    }) =>
      api(`/picks/${input.pickId}/eyes`, {
        method: 'PUT',
        body: { leftEye: input.leftEye, rightEye: input.rightEye },
      }),
  );

export interface DeliveryStatus {
  release: number | null;
  releasedAt: string | null;
  files: number;
  changed: number;
  people: number;
  offices: string[];
  departments: string[];
  /** Why the set cannot be released now, or null when it can. */
  releaseBlocker: string | null;
}

export const useDeliveryStatus = (dayId: string) =>
  useQuery({
    queryKey: ['days', dayId, 'delivery'],
    queryFn: () => api<DeliveryStatus>(`/days/${dayId}/delivery`),
    // Renders finish in the background: while something stops the release, look again now and
    // then, so the button comes on when the set is ready.
    refetchInterval: (query) => (query.state.data?.releaseBlocker ? 5000 : false),
  });

export const useReleaseSet = (dayId: string) =>
  useSetMutation(dayId, () =>
    api<{ release: number; files: number; changed: number; people: number; unchanged: boolean }>(
      `/days/${dayId}/delivery/release`,
      { method: 'POST' },
    ),
  );
