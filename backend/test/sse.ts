import { createParser, type EventSourceMessage } from 'eventsource-parser';

/** One open server-sent-event stream read with Node's fetch, parsed with eventsource-parser. */
export interface SseStream {
  status: number;
  headers: Headers;
  /** Every event received so far. */
  events: EventSourceMessage[];
  /** Every comment line received so far (heartbeats). */
  comments: string[];
  /** The first event (from the start of the stream) matching `predicate` not yet taken by an earlier call; rejects after `timeoutMs`. */
  next(predicate?: (event: EventSourceMessage) => boolean, timeoutMs?: number): Promise<EventSourceMessage>;
  /** Resolves when the server ends the stream. */
  ended: Promise<void>;
  close(): void;
}

export interface OpenStreamOptions {
  token?: string;
  lastEventId?: string;
  headers?: Record<string, string>;
}

/** Opens `url`; for a non-200 answer the body is read and the stream is already closed (`events` empty). */
export async function openStream(url: string, options: OpenStreamOptions = {}): Promise<SseStream & { body?: any }> {
  const controller = new AbortController();
  const headers: Record<string, string> = { Accept: 'text/event-stream', ...options.headers };
  if (options.token) headers.Authorization = `Bearer ${options.token}`;
  if (options.lastEventId) headers['Last-Event-ID'] = options.lastEventId;
  const res = await fetch(url, { headers, signal: controller.signal });
  const events: EventSourceMessage[] = [];
  const comments: string[] = [];
  const taken = new Set<EventSourceMessage>();
  const waiters = new Set<() => void>();
  const wake = () => waiters.forEach((w) => w());
  const close = () => controller.abort();

  if (res.status !== 200 || !res.body) {
    const text = await res.text();
    let body: unknown = text;
    try {
      body = JSON.parse(text);
    } catch {
      /* not JSON */
    }
    return { status: res.status, headers: res.headers, events, comments, body, ended: Promise.resolve(), close, next: () => Promise.reject(new Error(`no stream: ${res.status}`)) };
  }

  const parser = createParser({
    onEvent: (event) => {
      events.push(event);
      wake();
    },
    onComment: (comment) => {
      comments.push(comment);
      wake();
    },
  });
  let done = false;
  const ended = (async () => {
    const reader = res.body!.pipeThrough(new TextDecoderStream()).getReader();
    try {
      for (;;) {
        const { value, done: finished } = await reader.read();
        if (finished) break;
        parser.feed(value);
      }
    } catch {
      /* aborted by close() */
    } finally {
      done = true;
      wake();
    }
  })();

  const next = (predicate: (event: EventSourceMessage) => boolean = () => true, timeoutMs = 5000) =>
    new Promise<EventSourceMessage>((resolve, reject) => {
      const check = () => {
        const found = events.find((e) => !taken.has(e) && predicate(e));
        if (found) {
          taken.add(found);
          finish();
          resolve(found);
        } else if (done) {
          finish();
          reject(new Error(`the stream ended without a matching event (received: ${events.map((e) => e.data).join(' | ')})`));
        }
      };
      const timer = setTimeout(() => {
        finish();
        reject(new Error(`no matching event within ${timeoutMs} ms (received: ${events.map((e) => e.data).join(' | ')})`));
      }, timeoutMs);
      const finish = () => {
        clearTimeout(timer);
        waiters.delete(check);
      };
      waiters.add(check);
      check();
    });

  return { status: res.status, headers: res.headers, events, comments, next, ended, close };
}

/** The JSON of an event. */
export function data<T = any>(event: EventSourceMessage): T {
  return JSON.parse(event.data) as T;
}
