// The one way the client talks to the server: JSON in and out, the error shape of DESIGN.md §9
// turned into ApiError, and the CSRF synchronizer token sent on every state-changing request.
import { noteApiAnswer } from './database-status';

export type ApiErrorBody = {
  code: string;
  message: string;
  field?: string;
  details?: Record<string, unknown>;
};

export class ApiError extends Error {
  readonly status: number;
  readonly code: string;
  readonly field: string | undefined;
  readonly details: Record<string, unknown> | undefined;

  constructor(status: number, body: ApiErrorBody) {
    super(body.message);
    this.name = 'ApiError';
    this.status = status;
    this.code = body.code;
    this.field = body.field;
    this.details = body.details;
  }
}

export function isApiError(error: unknown): error is ApiError {
  return error instanceof ApiError;
}

type Method = 'GET' | 'POST' | 'PUT' | 'PATCH' | 'DELETE';

const CSRF_HEADER = 'X-CSRF-Token';
let csrfToken: string | null = null;
let csrfRequest: Promise<string> | null = null;

/** Sign-in returns a fresh token (the session is regenerated); sign-out forgets it. */
export function setCsrfToken(token: string | null): void {
  csrfToken = token;
}

async function fetchCsrfToken(): Promise<string> {
  // Several mutations at once share one token request.
  csrfRequest ??= request<{ csrfToken: string }>('GET', '/api/auth/csrf')
    .then((body) => {
      csrfToken = body.csrfToken;
      return body.csrfToken;
    })
    .finally(() => {
      csrfRequest = null;
    });
  return csrfRequest;
}

function describeStatus(status: number): string {
  if (status >= 500)
    return `The server failed (HTTP ${status}). Try again; if it persists, ask the administrator.`;
  if (status === 404) return 'The server does not know this address (HTTP 404).';
  return `The server answered HTTP ${status} without an explanation.`;
}

async function readError(response: Response): Promise<ApiError> {
  let body: unknown = null;
  try {
    body = await response.json();
  } catch {
    // Not JSON (a proxy page, an empty body): fall through to a generic message.
  }
  const error = (body as { error?: Partial<ApiErrorBody> } | null)?.error;
  if (error && typeof error.code === 'string' && typeof error.message === 'string') {
    return new ApiError(response.status, {
      code: error.code,
      message: error.message,
      ...(typeof error.field === 'string' ? { field: error.field } : {}),
      ...(error.details && typeof error.details === 'object' ? { details: error.details } : {}),
    });
  }
  return new ApiError(response.status, {
    code: `HTTP_${response.status}`,
    message: describeStatus(response.status),
  });
}

async function request<T>(
  method: Method,
  path: string,
  body?: unknown,
  headers: Record<string, string> = {},
  read: 'json' | 'blob' = 'json',
): Promise<T> {
  let response: Response;
  try {
    response = await fetch(path, {
      method,
      credentials: 'same-origin',
      headers: {
        Accept: 'application/json',
        ...(body !== undefined ? { 'Content-Type': 'application/json' } : {}),
        ...headers,
      },
      ...(body !== undefined ? { body: JSON.stringify(body) } : {}),
    });
  } catch {
    throw new ApiError(0, {
      code: 'NETWORK',
      message:
        'Could not reach the Modewright server. Check the connection and that it is running.',
    });
  }
  if (!response.ok) {
    const error = await readError(response);
    noteApiAnswer(response.status, error.code);
    throw error;
  }
  noteApiAnswer(response.status);
  if (response.status === 204) return undefined as T;
  if (read === 'blob') return (await response.blob()) as T;
  const text = await response.text();
  return (text ? JSON.parse(text) : undefined) as T;
}

async function mutate<T>(method: Method, path: string, body?: unknown): Promise<T> {
  const token = csrfToken ?? (await fetchCsrfToken());
  try {
    return await request<T>(method, path, body, { [CSRF_HEADER]: token });
  } catch (error) {
    // The session may have been renewed (server restart, another tab signed in): fetch a new
    // token once and retry; a second refusal is real.
    if (isApiError(error) && error.status === 403 && error.code === 'CSRF_INVALID') {
      csrfToken = null;
      const fresh = await fetchCsrfToken();
      return request<T>(method, path, body, { [CSRF_HEADER]: fresh });
    }
    throw error;
  }
}

export const api = {
  get: <T>(path: string) => request<T>('GET', path),
  /** A file the server sends (a spreadsheet); errors arrive as ApiError like any other answer. */
  getFile: (path: string) => request<Blob>('GET', path, undefined, { Accept: '*/*' }, 'blob'),
  post: <T>(path: string, body?: unknown) => mutate<T>('POST', path, body ?? {}),
  put: <T>(path: string, body?: unknown) => mutate<T>('PUT', path, body ?? {}),
  patch: <T>(path: string, body?: unknown) => mutate<T>('PATCH', path, body ?? {}),
  delete: <T = void>(path: string) => mutate<T>('DELETE', path),
};
