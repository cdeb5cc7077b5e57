// The one place the browser talks to the API. Everything goes through TanStack Query hooks built on this.
//
// Sessions: the short-lived access token lives only in memory (never in localStorage, so a script
// injected into the page cannot carry it away for long); the refresh token is an httpOnly cookie
// scoped to /api/auth that scripts cannot read at all. When a request meets a 401 because the access
// token expired (or there is none yet), apiFetch refreshes once and repeats the request.

/** An HTTP error from the API with its status, stable code and, when the server gave them, messages per field. */
export class ApiError extends Error {
  override name = 'ApiError';
  constructor(
    public readonly status: number,
    message: string,
    public readonly body: unknown,
  ) {
    super(message);
  }

  /** The server's machine-readable reason, e.g. `invalid_credentials`, `invitation_expired`. */
  get code(): string | undefined {
    return this.body && typeof this.body === 'object' && 'code' in this.body && typeof this.body.code === 'string' ? this.body.code : undefined;
  }

  /** Messages per field (`{ email: ['…'] }`) from a 400 or 409, else an empty object. */
  get fieldErrors(): Record<string, string[]> {
    if (this.body && typeof this.body === 'object' && 'errors' in this.body && this.body.errors && typeof this.body.errors === 'object') {
      return this.body.errors as Record<string, string[]>;
    }
    return {};
  }
}

type Listener = (token: string | null) => void;
let accessToken: string | null = null;
const listeners = new Set<Listener>();

/** The in-memory session: who is signed in is decided by whether a refresh succeeds. */
export const session = {
  get token(): string | null {
    return accessToken;
  },
  set(token: string | null): void {
    if (token === accessToken) return;
    accessToken = token;
    for (const listener of listeners) listener(token);
  },
  /** Called with the new token (or null when the session ended); returns the unsubscribe function. */
  subscribe(listener: Listener): () => void {
    listeners.add(listener);
    return () => listeners.delete(listener);
  },
};

let refreshing: Promise<boolean> | null = null;

/**
 * Trades the refresh cookie for a new access token. Concurrent callers share one request, so a
 * page that fires several queries at once rotates the refresh token only once.
 */
export function refreshSession(): Promise<boolean> {
  refreshing ??= (async () => {
    try {
      const response = await fetch('/api/auth/refresh', { method: 'POST', credentials: 'same-origin', headers: { Accept: 'application/json' } });
      if (!response.ok) {
        session.set(null);
        return false;
      }
      const body = (await response.json()) as { accessToken: string };
      session.set(body.accessToken);
      return true;
    } catch {
      return false;
    } finally {
      refreshing = null;
    }
  })();
  return refreshing;
}

const RETRYABLE = new Set(['access_token_expired', 'access_token_invalid', 'access_token_revoked', 'not_signed_in']);

export interface ApiInit extends RequestInit {
  /** Send the access token and refresh on 401 (default). False for sign-in, register and other public calls. */
  auth?: boolean;
}

export async function apiFetch<T>(path: string, init: ApiInit = {}): Promise<T> {
  const { auth = true, ...requestInit } = init;
  if (auth && !session.token) await refreshSession();
  let response = await send(path, requestInit, auth);
  if (auth && response.status === 401) {
    const body = await readBody(response.clone());
    const code = body && typeof body === 'object' && 'code' in body ? String(body.code) : '';
    if (RETRYABLE.has(code) && (await refreshSession())) response = await send(path, requestInit, auth);
  }
  const body = await readBody(response);
  if (!response.ok) {
    const message =
      body && typeof body === 'object' && 'message' in body && typeof body.message === 'string'
        ? body.message
        : `Request failed (${response.status})`;
    throw new ApiError(response.status, message, body);
  }
  return body as T;
}

/**
 * A binary answer (thumbnails) as a Blob, with the same token handling as `apiFetch`. `path` is relative to
 * /api; a path the server gave that already starts with /api is accepted as it is.
 */
export async function apiFetchBlob(path: string): Promise<Blob> {
  const relative = path.startsWith('/api/') ? path.slice(4) : path;
  if (!session.token) await refreshSession();
  let response = await send(relative, {}, true);
  if (response.status === 401 && (await refreshSession())) response = await send(relative, {}, true);
  if (!response.ok) throw new ApiError(response.status, `Request failed (${response.status})`, null);
  return response.blob();
}

async function send(path: string, init: RequestInit, auth: boolean): Promise<Response> {
  const headers = new Headers(init.headers);
  if (init.body && !(init.body instanceof FormData)) headers.set('Content-Type', 'application/json');
  headers.set('Accept', 'application/json');
  if (auth && session.token) headers.set('Authorization', `Bearer ${session.token}`);
  try {
    return await fetch(`/api${path}`, { credentials: 'same-origin', ...init, headers });
  } catch {
    throw new ApiError(0, 'The server cannot be reached. Check your connection and try again.', null);
  }
}

async function readBody(response: Response): Promise<unknown> {
  const text = await response.text();
  return text ? safeJson(text) : null;
}

function safeJson(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    return text;
  }
}

/** JSON body helper: `apiFetch(path, json('POST', body))`. */
export function json(method: string, body?: unknown, extra: ApiInit = {}): ApiInit {
  return { ...extra, method, body: body === undefined ? undefined : JSON.stringify(body) };
}
