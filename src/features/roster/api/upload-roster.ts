import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { RosterDraft } from '../../../../server/schemas/roster';
import { apiErrorSchema } from '../../../../server/schemas/common';
import { ApiError } from '../../../lib/api-client';

export interface UploadInput {
  clientId: string;
  file: File;
  /** Share of the bytes sent so far, 0 to 1. */
  onProgress?: (share: number) => void;
}

/**
 * Sends the file's bytes as they are (the server detects the encoding). XMLHttpRequest rather
 * than fetch because only it reports upload progress.
 */
export function uploadRoster({ clientId, file, onProgress }: UploadInput): Promise<RosterDraft> {
  return new Promise((resolve, reject) => {
    const request = new XMLHttpRequest();
    const name = encodeURIComponent(file.name);
    request.open('POST', `/api/clients/${clientId}/roster/imports?fileName=${name}`);
    request.setRequestHeader('Content-Type', 'application/octet-stream');
    request.upload.onprogress = (event) => {
      if (event.lengthComputable) onProgress?.(event.loaded / event.total);
    };
    request.onerror = () =>
      reject(
        new ApiError(0, 'network', 'No connection to the server. Check the network and try again.'),
      );
    request.onload = () => {
      let payload: unknown = null;
      try {
        payload = JSON.parse(request.responseText);
      } catch {
        payload = null;
      }
      if (request.status >= 200 && request.status < 300) {
        resolve(payload as RosterDraft);
        return;
      }
      const parsed = apiErrorSchema.safeParse(payload);
      reject(
        parsed.success
          ? new ApiError(request.status, parsed.data.error.code, parsed.data.error.message)
          : new ApiError(request.status, 'unexpected', `The server answered ${request.status}.`),
      );
    };
    request.send(file);
  });
}

export function useUploadRoster() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadRoster,
    // The new file replaces the uploader's open import.
    onSuccess: (_draft, input) =>
      queryClient.invalidateQueries({ queryKey: ['roster-open-import', input.clientId] }),
  });
}
