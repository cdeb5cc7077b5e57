import { createContext, useContext, useMemo, useSyncExternalStore } from 'react';
import type { SetupIssue } from '@fieldbound/shared';
import { issuesAt, setIn, type SetupDraft } from './setupDraft';

export interface SetupFormSnapshot {
  draft: SetupDraft;
  issues: readonly SetupIssue[];
}

/**
 * The setup form's draft and issues as a store the fields subscribe to, each to its own slice: a keystroke then
 * re-renders the field typed in and the fields whose value or messages changed, not the whole form (antd form
 * items take longer than a frame together). The store mirrors the panel's props; it never owns the draft.
 */
export class SetupFormStore {
  private snapshot: SetupFormSnapshot;
  /** The newest draft: the props', or one handed out by `set` whose props have not come back yet. */
  private latest: SetupDraft;
  private readonly listeners = new Set<() => void>();
  private emit: (draft: SetupDraft) => void;

  constructor(snapshot: SetupFormSnapshot, emit: (draft: SetupDraft) => void) {
    this.snapshot = snapshot;
    this.latest = snapshot.draft;
    this.emit = emit;
  }

  readonly get = (): SetupFormSnapshot => this.snapshot;

  readonly subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  /** The panel's props after a commit: subscribers whose slice changed re-render. */
  publish(snapshot: SetupFormSnapshot, emit: (draft: SetupDraft) => void): void {
    this.emit = emit;
    if (snapshot.draft === this.snapshot.draft && snapshot.issues === this.snapshot.issues) return;
    this.snapshot = snapshot;
    this.latest = snapshot.draft;
    for (const listener of [...this.listeners]) listener();
  }

  /** The newest draft (for handlers that build on it, such as a preset or a new field band). */
  draft(): SetupDraft {
    return this.latest;
  }

  /** Hands the owner a copy of the newest draft with `value` at `path`. */
  set(path: readonly (string | number)[], value: unknown): void {
    this.replace(setIn(this.latest, path, value));
  }

  /** Hands the owner a whole new draft. */
  replace(draft: SetupDraft): void {
    this.latest = draft;
    this.emit(draft);
  }
}

export const SetupFormStoreContext = createContext<SetupFormStore | null>(null);

export function useSetupFormStore(): SetupFormStore {
  const store = useContext(SetupFormStoreContext);
  if (!store) throw new Error('useSetupFormStore: a setup field is rendered outside SetupPanel');
  return store;
}

/**
 * A slice of the draft; the component re-renders only when it changes (`Object.is`). The selection must be a
 * primitive or a part of the draft itself (unchanged parts keep their identity: `setIn` copies only the path).
 */
export function useDraftSlice<T>(select: (draft: SetupDraft) => T): T {
  const store = useSetupFormStore();
  return useSyncExternalStore(store.subscribe, () => select(store.get().draft));
}

/** The setup rules' messages for `path` (and below it), joined: empty when there are none. */
export function useIssueText(path: string): string {
  const store = useSetupFormStore();
  return useSyncExternalStore(store.subscribe, () => issuesAt(store.get().issues, path).join('; '));
}

/** A stable setter for the value at a dotted path ("fieldBands.2.label"; numeric parts index arrays). */
export function useDraftSetter(path: string): (value: unknown) => void {
  const store = useSetupFormStore();
  return useMemo(() => {
    const parts = path.split('.').map((p) => (/^\d+$/.test(p) ? Number(p) : p));
    return (value: unknown) => store.set(parts, value);
  }, [store, path]);
}
