import type {
  ErrorEvent,
  EvaluationJob,
  EvaluationResponse,
  EvaluationStarted,
  LatestEvaluationResponse,
  ProgressEvent,
} from '../../../../../core/contract/sheets';
import { ApiError } from '../../../lib/api-client';
import { api } from '../../../lib/api-client';
import { readApiError, writeRequest } from './request';
import type { Draft } from './types';

export type { EvaluationJob, EvaluationResponse, EvaluationStarted };

/** What the editor shows of an evaluation's progress: one line and the share done. */
export type EvaluationProgress = { message: string; fraction: number | null };

function progressOf(d: ProgressEvent): EvaluationProgress {
  const fraction = d.fraction;
  // The server's message names the block (and, while a modes block solves, the method's stage
  // and the modes converged); the iteration is added here.
  const parts = d.message ? [d.message] : [];
  if (typeof d.iteration === 'number') parts.push(`iteration ${d.iteration}`);
  return { message: parts.join(' · ') || 'Solving…', fraction };
}

/**
 * Evaluates the editor's current text on the server over server-sent events: `progress` events
 * while it works, then one `result` or `error`. Aborting the signal closes the connection, which
 * the server takes as cancellation.
 */
export async function evaluateStream(
  sheetId: number | string,
  draft: Draft,
  signal: AbortSignal,
  onProgress: (progress: EvaluationProgress) => void,
): Promise<EvaluationResponse> {
  const response = await writeRequest('POST', `/api/sheets/${sheetId}/evaluate/stream`, {
    body: JSON.stringify(draft),
    headers: { 'Content-Type': 'application/json', Accept: 'text/event-stream' },
    signal,
  });
  const type = response.headers.get('Content-Type') ?? '';
  if (!type.includes('text/event-stream') || !response.body) {
    // A server that answers in one piece is accepted as well.
    return (await response.json()) as EvaluationResponse;
  }
  return readEvents<EvaluationResponse>(response, onProgress);
}

/**
 * Reads server-sent events up to the first `result` (returned: `T`, the answer the route sends)
 * or `error` (thrown).
 */
async function readEvents<T extends EvaluationResponse | EvaluationJob>(
  response: Response,
  onProgress: (progress: EvaluationProgress) => void,
): Promise<T> {
  if (!response.body)
    throw new ApiError(0, { code: 'STREAM_ENDED', message: 'The server sent no events.' });
  const reader = response.body.pipeThrough(new TextDecoderStream()).getReader();
  let buffer = '';
  for (;;) {
    const { value, done } = await reader.read();
    if (done) break;
    buffer += value.replace(/\r\n/g, '\n');
    let end = buffer.indexOf('\n\n');
    while (end >= 0) {
      const chunk = buffer.slice(0, end);
      buffer = buffer.slice(end + 2);
      end = buffer.indexOf('\n\n');
      let event = 'message';
      const data: string[] = [];
      for (const line of chunk.split('\n')) {
        if (line.startsWith('event:')) event = line.slice(6).trim();
        else if (line.startsWith('data:')) data.push(line.slice(5).replace(/^ /, ''));
      }
      if (data.length === 0) continue;
      let parsed: unknown;
      try {
        parsed = JSON.parse(data.join('\n'));
      } catch {
        parsed = data.join('\n');
      }
      if (event === 'progress') onProgress(progressOf(parsed as ProgressEvent));
      else if (event === 'result') {
        void reader.cancel();
        return parsed as T;
      } else if (event === 'error') {
        void reader.cancel();
        const body: Partial<ErrorEvent['error']> = (parsed as Partial<ErrorEvent>).error ?? {};
        throw new ApiError(422, {
          code: body.code ?? 'EVALUATION_FAILED',
          message: body.message ?? 'The evaluation failed.',
          ...(body.details ? { details: body.details } : {}),
        });
      }
    }
  }
  throw new ApiError(0, {
    code: 'STREAM_ENDED',
    message:
      'The server closed the evaluation before sending a result. Edit or press Run to retry.',
  });
}

/**
 * Starts an evaluation that goes on when the page closes (the server keeps it as a job): the
 * job, waiting; or, for a text the server has evaluated before, the stored results at once
 * (`state` done, `fromStore`).
 */
export async function startEvaluation(
  sheetId: number | string,
  draft: Draft,
): Promise<EvaluationStarted['job']> {
  const body = await api.post<EvaluationStarted>(`/api/sheets/${sheetId}/evaluations`, draft);
  return body.job;
}

/** The person's latest evaluation of the sheet, running or finished, or null. */
export async function latestEvaluation(sheetId: number | string): Promise<EvaluationJob | null> {
  return (await api.get<LatestEvaluationResponse>(`/api/sheets/${sheetId}/evaluations/latest`)).job;
}

export function cancelEvaluation(sheetId: number | string, jobId: string): Promise<void> {
  return api.delete(`/api/sheets/${sheetId}/evaluations/${jobId}`);
}

/**
 * Follows an evaluation job over server-sent events to its results. Aborting the signal stops
 * following; the evaluation itself goes on (cancelEvaluation stops it).
 */
export async function followEvaluation(
  sheetId: number | string,
  jobId: string,
  signal: AbortSignal,
  onProgress: (progress: EvaluationProgress) => void,
): Promise<EvaluationJob> {
  let response: Response;
  try {
    response = await fetch(`/api/sheets/${sheetId}/evaluations/${jobId}/events`, {
      credentials: 'same-origin',
      headers: { Accept: 'text/event-stream' },
      signal,
    });
  } catch (error) {
    if (error instanceof DOMException && error.name === 'AbortError') throw error;
    throw new ApiError(0, {
      code: 'NETWORK',
      message:
        'Could not reach the Modewright server. Check the connection and that it is running.',
    });
  }
  if (!response.ok) throw await readApiError(response);
  return readEvents<EvaluationJob>(response, onProgress);
}
