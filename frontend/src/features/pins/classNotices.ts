import { useCallback, useEffect, useMemo, useState } from 'react';
import type { RegionName } from '../map-render/regionField';
import type { PinRegion } from './pinGeometry';

/** The classes under the pins from one finished computation, and which quantity the regions show ("m0", "survivors"). */
export interface PinRegions {
  byPin: ReadonlyMap<string, PinRegion | null>;
  shownKey: string;
}

type Baselines = Record<string, Record<string, RegionName>>;
const STORAGE_KEY = 'fieldbound.pinClasses';
/** The one empty notice map: no notices keeps the same value, so the pins overlay (and the map) need not re-render. */
const NO_NOTICES: ReadonlyMap<string, string> = new Map<string, string>();

function load(): Baselines {
  try {
    const raw = globalThis.localStorage?.getItem(STORAGE_KEY);
    const parsed: unknown = raw ? JSON.parse(raw) : {};
    return parsed && typeof parsed === 'object' ? (parsed as Baselines) : {};
  } catch {
    return {};
  }
}
function save(b: Baselines): void {
  try {
    globalThis.localStorage?.setItem(STORAGE_KEY, JSON.stringify(b));
  } catch {
    // Private windows may refuse storage: the notices then last for the page's life only.
  }
}

/** The notice a pin shows when the class under it differs from the one first seen there. */
export function classChangeNotice(before: RegionName, now: RegionName): string {
  return `class changed: ${before} → ${now}`;
}

/**
 * Remembers, per pin and shown quantity, the class first seen under it (in this browser), and says so when a later
 * computation — another ion motion, observation time or range — puts a different class there. "Noted" makes the
 * current class the new reference.
 */
export function useClassNotices(regions: PinRegions | null): { notices: ReadonlyMap<string, string>; acknowledge: (pinId: string) => void } {
  const [baselines, setBaselines] = useState<Baselines>(load);

  useEffect(() => {
    if (!regions) return;
    setBaselines((prev) => {
      let changed = false;
      const next: Baselines = { ...prev };
      for (const [pinId, region] of regions.byPin) {
        if (!region || next[pinId]?.[regions.shownKey]) continue;
        next[pinId] = { ...next[pinId], [regions.shownKey]: region.dominant };
        changed = true;
      }
      if (!changed) return prev;
      save(next);
      return next;
    });
  }, [regions]);

  const acknowledge = useCallback(
    (pinId: string) => {
      const now = regions?.byPin.get(pinId);
      if (!regions || !now) return;
      setBaselines((prev) => {
        const next = { ...prev, [pinId]: { ...prev[pinId], [regions.shownKey]: now.dominant } };
        save(next);
        return next;
      });
    },
    [regions],
  );

  const notices = useMemo(() => {
    const out = new Map<string, string>();
    if (!regions) return NO_NOTICES;
    for (const [pinId, region] of regions.byPin) {
      const before = baselines[pinId]?.[regions.shownKey];
      if (region && before && before !== region.dominant) out.set(pinId, classChangeNotice(before, region.dominant));
    }
    return out.size > 0 ? out : NO_NOTICES;
  }, [regions, baselines]);
  return { notices, acknowledge };
}
