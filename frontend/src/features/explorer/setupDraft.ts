import { bindingInputsKey, validateSetup, type MapSetup, type SetupIssue } from '@fieldbound/shared';

/**
 * A setup being edited: shaped like MapSetup, but any number may be missing (`undefined`) or not a number
 * while the user types. `validateSetup` — the same rules the server applies — says what is wrong.
 */
export type SetupDraft = MapSetup;

/** A copy of `obj` with the value at `path` replaced (plain objects and arrays only). */
export function setIn<T>(obj: T, path: readonly (string | number)[], value: unknown): T {
  if (path.length === 0) return value as T;
  const [head, ...rest] = path;
  const src = obj as unknown as Record<string | number, unknown>;
  const copy = (Array.isArray(obj) ? [...obj] : { ...src }) as Record<string | number, unknown>;
  copy[head] = setIn(src[head], rest, value);
  return copy as T;
}

/** The value at a dotted path ("fieldBands.2.minTesla"); undefined where the path leads nowhere. */
export function getIn(obj: unknown, path: string): unknown {
  let v: unknown = obj;
  for (const key of path.split('.')) {
    if (v === null || typeof v !== 'object') return undefined;
    v = (v as Record<string, unknown>)[key];
  }
  return v;
}

/** Issues whose path is `path` or lies below it (e.g. "contours.levelsKelvin" also takes "contours.levelsKelvin.2"). */
export function issuesAt(issues: readonly SetupIssue[], path: string): string[] {
  return issues.filter((i) => i.path === path || i.path.startsWith(`${path}.`)).map((i) => i.message);
}

export interface DraftCheck {
  issues: SetupIssue[];
  valid: MapSetup | null;
  /** The draft changes what the engine computes (not only display, motion or contours). */
  needsCompute: boolean;
}

/** The one empty issue list: a valid draft always gives the same array, so memoised fields see no change. */
const NO_ISSUES: SetupIssue[] = [];

/** The setup rules on a draft alone (what the form shows): its issues and, when there are none, the valid setup. */
export function validateDraft(draft: SetupDraft): Omit<DraftCheck, 'needsCompute'> {
  const result = validateSetup(draft);
  return result.ok ? { issues: NO_ISSUES, valid: result.setup } : { issues: result.issues, valid: null };
}

/** A valid setup changes what the engine computes, compared with the applied one. */
export function changesBinding(valid: MapSetup | null, applied: MapSetup): boolean {
  return valid !== null && bindingInputsKey(valid) !== bindingInputsKey(applied);
}

export function checkDraft(draft: SetupDraft, applied: MapSetup): DraftCheck {
  const { issues, valid } = validateDraft(draft);
  return { issues, valid, needsCompute: changesBinding(valid, applied) };
}
