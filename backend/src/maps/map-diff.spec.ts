import { describe, expect, it } from 'vitest';
import { defaultSetup } from '@fieldbound/shared';
import { diffMapContent } from './map-diff';

const base = () => ({ title: 'Cs at high field', description: '', tags: ['cs'], setup: defaultSetup() as unknown as Record<string, unknown> });

describe('diffMapContent', () => {
  it('returns no changes for equal content', () => {
    expect(diffMapContent(base(), base())).toEqual([]);
  });

  it('names the leaf path of a changed setup number with both values', () => {
    const a = base();
    const b = base();
    const axis = (b.setup.alphaAxis as { min: number }).min;
    (b.setup.alphaAxis as { min: number }).min = axis * 2;
    expect(diffMapContent(a, b)).toEqual([{ path: 'setup.alphaAxis.min', before: axis, after: axis * 2 }]);
  });

  it('reports arrays whole and title changes by name', () => {
    const a = base();
    const b = { ...base(), title: 'Cs, revised', tags: ['cs', 'lecture'] };
    expect(diffMapContent(a, b)).toEqual([
      { path: 'title', before: 'Cs at high field', after: 'Cs, revised' },
      { path: 'tags', before: ['cs'], after: ['cs', 'lecture'] },
    ]);
  });

  it('reports a key present on one side only without the missing value', () => {
    const a = { ...base(), setup: { motion: { kind: 'none' } } };
    const b = { ...base(), setup: { motion: { kind: 'temperature', kelvin: 4 } } };
    expect(diffMapContent(a, b)).toEqual([
      { path: 'setup.motion.kelvin', after: 4 },
      { path: 'setup.motion.kind', before: 'none', after: 'temperature' },
    ]);
  });
});
