export interface ApiIssue {
  path: string;
  message: string;
}

/** Every failed API call becomes one of these, carrying the server's `{ error: { code, message } }`. */
export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly issues: ApiIssue[] = [],
  ) {
    super(message);
    this.name = 'ApiError';
  }
}

interface RequestOptions {
  method?: 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';
  body?: unknown;
  signal?: AbortSignal;
  /** Where `path` lives: the JSON API, or the sign-in routes beside it. */
  root?: '/api' | '/auth';
  /** Extra request headers, e.g. an `Idempotency-Key` that makes a retried send safe. */
  headers?: Record<string, string>;
}

async function errorFrom(response: Response): Promise<ApiError> {
  try {
    const payload = (await response.json()) as {
      error?: { code?: string; message?: string; issues?: ApiIssue[] };
    };
    if (payload.error?.code) {
      return new ApiError(
        response.status,
        payload.error.code,
        payload.error.message ?? '',
        payload.error.issues,
      );
    }
  } catch {
    // Not our JSON: a proxy or the network answered.
  }
  return new ApiError(response.status, 'http_error', `The server answered ${response.status}.`);
}

/** The one way the client talks to the API: same-origin, JSON, typed errors, no UI side effects. */
export async function api<T>(path: string, options: RequestOptions = {}): Promise<T> {
  const { method = 'GET', body, signal, root = '/api' } = options;
  const headers: Record<string, string> = { ...options.headers, Accept: 'application/json' };
  // A header a cross-site form cannot send; the server refuses state changes without it.
  if (method !== 'GET') headers['X-Requested-With'] = 'brinewatch';
  let payload: BodyInit | undefined;
  if (body instanceof FormData) payload = body;
  else if (body !== undefined) {
    headers['Content-Type'] = 'application/json';
    payload = JSON.stringify(body);
  }
  let response: Response;
  try {
    response = await fetch(`${root}${path}`, {
      method,
      headers,
      body: payload,
      signal,
      credentials: 'same-origin',
    });
  } catch (error) {
    if (signal?.aborted) throw error;
    throw new ApiError(0, 'network_error', 'Brinewatch could not be reached. Check your connection.');
  }
  if (!response.ok) throw await errorFrom(response);
  if (response.status === 204) return undefined as T;
  return (await response.json()) as T;
}
