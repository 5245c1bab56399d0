// Requests the shared JSON client cannot make: a save with `If-Match`, a multipart upload and a
// streamed evaluation. They keep the client's conventions: the same error shape (ApiError), the
// CSRF token from `/api/auth/csrf` on every write, fetched again once when the server refuses it.
import { api, ApiError, isApiError } from '../../../lib/api-client';
import { noteApiAnswer } from '../../../lib/database-status';

let token: string | null = null;

async function csrfToken(fresh = false): Promise<string> {
  if (!token || fresh) token = (await api.get<{ csrfToken: string }>('/api/auth/csrf')).csrfToken;
  return token;
}

export async function readApiError(response: Response): Promise<ApiError> {
  let body: unknown = null;
  try {
    body = await response.json();
  } catch {
    // Not JSON: a generic message below.
  }
  const error = (body as { error?: Record<string, unknown> } | null)?.error;
  noteApiAnswer(response.status, typeof error?.code === 'string' ? error.code : undefined);
  if (error && typeof error.code === 'string' && typeof error.message === 'string') {
    return new ApiError(response.status, {
      code: error.code,
      message: error.message,
      ...(typeof error.field === 'string' ? { field: error.field } : {}),
      ...(error.details && typeof error.details === 'object'
        ? { details: error.details as Record<string, unknown> }
        : {}),
    });
  }
  const message =
    response.status === 413
      ? 'The file is larger than the server accepts (HTTP 413).'
      : `The server answered HTTP ${response.status} without an explanation.`;
  return new ApiError(response.status, { code: `HTTP_${response.status}`, message });
}

const offline = () =>
  new ApiError(0, {
    code: 'NETWORK',
    message: 'Could not reach the Modewright server. Check the connection and that it is running.',
  });

/**
 * A state-changing request with the CSRF header; resolves to the raw Response when it is OK and
 * throws ApiError otherwise (status 0 when the server cannot be reached).
 */
export async function writeRequest(
  method: 'POST' | 'PUT',
  path: string,
  init: { body: BodyInit; headers?: Record<string, string>; signal?: AbortSignal },
): Promise<Response> {
  const send = async (fresh: boolean) => {
    const csrf = await csrfToken(fresh);
    try {
      return await fetch(path, {
        method,
        credentials: 'same-origin',
        headers: { Accept: 'application/json', ...init.headers, 'X-CSRF-Token': csrf },
        body: init.body,
        ...(init.signal ? { signal: init.signal } : {}),
      });
    } catch (error) {
      if (error instanceof DOMException && error.name === 'AbortError') throw error;
      throw offline();
    }
  };
  let response = await send(false);
  if (!response.ok) {
    let error = await readApiError(response);
    if (error.status === 403 && error.code === 'CSRF_INVALID') {
      response = await send(true);
      if (response.ok) return response;
      error = await readApiError(response);
    }
    throw error;
  }
  noteApiAnswer(response.status);
  return response;
}

export { isApiError };
