import { apiErrorSchema } from '../../server/schemas/common';

/** An API answer other than 2xx, with the server's code, message and per-field errors. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fieldErrors: Record<string, string[] | undefined> = {},
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

type Method = 'GET' | 'POST' | 'PATCH' | 'PUT' | 'DELETE';

export async function api<T>(
  path: string,
  options: { method?: Method; body?: unknown } = {},
): Promise<T> {
  let response: Response;
  try {
    response = await fetch(`/api${path}`, {
      method: options.method ?? 'GET',
      credentials: 'same-origin',
      headers: options.body === undefined ? {} : { 'Content-Type': 'application/json' },
      body: options.body === undefined ? undefined : JSON.stringify(options.body),
    });
  } catch {
    throw new ApiError(
      0,
      'network',
      'No connection to the server. Check the network and try again.',
    );
  }
  if (response.status === 204) return undefined as T;
  const payload: unknown = await response.json().catch(() => null);
  if (!response.ok) {
    const parsed = apiErrorSchema.safeParse(payload);
    if (!parsed.success) {
      throw new ApiError(response.status, 'unexpected', `The server answered ${response.status}.`);
    }
    const details = parsed.data.error.details as
      { fieldErrors?: Record<string, string[]> } | undefined;
    throw new ApiError(
      response.status,
      parsed.data.error.code,
      parsed.data.error.message,
      details?.fieldErrors ?? {},
    );
  }
  return payload as T;
}
