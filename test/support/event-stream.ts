// Server-sent events in the API tests: a supertest request read to its end as text, and the text
// split into events.
import type { Test } from 'supertest';

/** Reads the whole response body of `req` as text (server-sent events are not JSON). */
export function asText(req: Test): Test {
  return req.buffer(true).parse((response, callback) => {
    let body = '';
    response.setEncoding('utf8');
    response.on('data', (chunk: string) => (body += chunk));
    response.on('end', () => callback(null, body));
  });
}

/** Splits a server-sent event stream into { event, data } records. */
export function parseEvents(text: string): { event: string; data: unknown }[] {
  return text
    .split('\n\n')
    .filter((chunk) => chunk.trim() !== '')
    .map((chunk) => {
      const event = /^event: (.*)$/m.exec(chunk)?.[1] ?? 'message';
      const data = /^data: (.*)$/m.exec(chunk)?.[1] ?? 'null';
      return { event, data: JSON.parse(data) };
    });
}
