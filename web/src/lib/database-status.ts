// Whether the server can reach its database, as its last answer said: a 503 DATABASE_UNAVAILABLE
// sets it, any other answer clears it. Every request path of the client reports here, and the
// app shell shows a banner while it is set.
import { useSyncExternalStore } from 'react';

let unavailable = false;
const listeners = new Set<() => void>();

/** Called with every API answer's status (and error code, when it is an error). */
export function noteApiAnswer(status: number, code?: string): void {
  const down = status === 503 && code === 'DATABASE_UNAVAILABLE';
  if (down === unavailable) return;
  unavailable = down;
  for (const listener of listeners) listener();
}

function subscribe(listener: () => void): () => void {
  listeners.add(listener);
  return () => listeners.delete(listener);
}

export function isDatabaseUnavailable(): boolean {
  return unavailable;
}

export function useDatabaseUnavailable(): boolean {
  return useSyncExternalStore(subscribe, isDatabaseUnavailable, isDatabaseUnavailable);
}
