import type { MapChange } from '@fieldbound/shared';
import { canonicalJson } from '@fieldbound/shared';

export interface MapContent {
  title: string;
  description: string;
  tags: string[];
  setup: unknown;
}

function isPlainObject(value: unknown): value is Record<string, unknown> {
  return value !== null && typeof value === 'object' && !Array.isArray(value);
}

/**
 * The values that differ between two versions of a map, as dotted paths with both values.
 * Objects are compared key by key (so `setup.alphaAxis.min` is reported, not all of `setup`);
 * arrays (tags, contour levels, species, field bands) are reported whole when they differ,
 * since an element's position alone says little. A key missing on one side has no before/after.
 */
export function diffMapContent(from: MapContent, to: MapContent): MapChange[] {
  const changes: MapChange[] = [];
  const walk = (path: string, a: unknown, b: unknown): void => {
    if (isPlainObject(a) && isPlainObject(b)) {
      const keys = [...new Set([...Object.keys(a), ...Object.keys(b)])].sort();
      for (const key of keys) walk(path ? `${path}.${key}` : key, a[key], b[key]);
      return;
    }
    if (a === undefined && b === undefined) return;
    if (a !== undefined && b !== undefined && canonicalJson(a) === canonicalJson(b)) return;
    const change: MapChange = { path };
    if (a !== undefined) change.before = a;
    if (b !== undefined) change.after = b;
    changes.push(change);
  };
  walk('title', from.title, to.title);
  walk('description', from.description, to.description);
  walk('tags', from.tags, to.tags);
  walk('setup', from.setup, to.setup);
  return changes;
}
