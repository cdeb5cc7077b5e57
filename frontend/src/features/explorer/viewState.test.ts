import { describe, expect, it } from 'vitest';
import { parseViewParams, roundProbe, writeViewParams } from './viewState';

describe('view state in the URL', () => {
  it('round-trips a zoom window, the shown orbital and a probe point', () => {
    const params = writeViewParams(new URLSearchParams('team=7'), {
      view: { alpha: [10, 300], field: [2, 20] },
      shown: { kind: 'orbital', m: 3 },
      probe: { alpha: 164.12345678, tesla: 12.5 },
    });
    expect(params.toString()).toBe('team=7&alpha=10%2C300&field=2%2C20&show=m3&probe=164.123%2C12.5');
    expect(parseViewParams(params)).toEqual({ view: { alpha: [10, 300], field: [2, 20] }, shown: { kind: 'orbital', m: 3 }, probe: { alpha: 164.123, tesla: 12.5 } });
  });
  it('ignores malformed or inverted values', () => {
    expect(parseViewParams(new URLSearchParams('alpha=300,10&field=1,2&show=m&probe=x,1'))).toEqual({ view: null, shown: null, probe: null });
  });
  it('reads the survivors view', () => {
    expect(parseViewParams(new URLSearchParams('show=survivors')).shown).toEqual({ kind: 'survivors' });
  });
  it('rounds a probe point to what the URL keeps, so reading the URL back gives the very same point', () => {
    const p = roundProbe({ alpha: 164.12345678, tesla: 0.000123456789 });
    expect(p).toEqual({ alpha: 164.123, tesla: 0.000123457 });
    expect(parseViewParams(writeViewParams(new URLSearchParams(), { view: null, shown: null, probe: p })).probe).toEqual(p);
  });
});
