import { describe, expect, it } from 'vitest';
import { geometryFromFields } from './mapGeometry';
import { warmUpFields } from './warmUpFields';

describe('warmUpFields', () => {
  it('exercises what a real map does: nested survivor regions, resonance and bound regions, and iso-lines at every level', () => {
    const survivors = geometryFromFields(warmUpFields(48, 'survivors'));
    expect(survivors.maxCount).toBe(3);
    expect(survivors.regions.map((r) => r.count)).toEqual([1, 2, 3]);
    expect(survivors.isoLines).toHaveLength(4);
    const orbital = geometryFromFields(warmUpFields(48, 'orbital'));
    expect(orbital.regions.map((r) => r.kind)).toEqual(['resonance', 'bound']);
    expect(orbital.outlines.length).toBeGreaterThan(0);
  });
});
