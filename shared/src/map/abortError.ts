/**
 * The part of an AbortSignal the engine reads (structural, so `shared/src` needs neither DOM nor
 * Node type definitions; a real `AbortSignal` satisfies it).
 */
export interface AbortSignalLike {
  readonly aborted: boolean;
}

/**
 * Throws an Error with `name === 'AbortError'` (the name `fetch` and DOM APIs use, which survives a
 * worker boundary) when the signal has been aborted; otherwise does nothing.
 *
 * @example
 * const c = new AbortController(); c.abort();
 * throwIfAborted(c.signal) // throws AbortError: binding map computation aborted
 */
export function throwIfAborted(signal: AbortSignalLike | undefined): void {
  if (signal?.aborted) {
    const e = new Error('binding map computation aborted');
    e.name = 'AbortError';
    throw e;
  }
}
