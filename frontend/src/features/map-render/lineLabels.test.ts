import { describe, expect, it } from 'vitest';
import { placeLineLabels } from './lineLabels';

describe('placeLineLabels', () => {
  it('puts the label of a horizontal 200 px line at its middle, unrotated', () => {
    expect(placeLineLabels([[[0, 10], [200, 10]]])).toEqual([{ x: 100, y: 10, angle: 0 }]);
  });
  it('keeps text upright on a line drawn right to left (angle 180° → 0°)', () => {
    const [label] = placeLineLabels([[[200, 10], [0, 10]]]);
    expect(label.angle).toBe(0);
  });
  it('follows a rising diagonal at −45° in screen space (y grows downwards)', () => {
    const [label] = placeLineLabels([[[0, 100], [100, 0]]]);
    expect(label.angle).toBeCloseTo(-45, 12);
    expect(label.x).toBeCloseTo(50, 12);
  });
  it('skips lines shorter than the minimum and keeps the longest when limited', () => {
    const lines: [number, number][][] = [
      [[0, 0], [50, 0]],
      [[0, 0], [300, 0]],
      [[0, 0], [150, 0]],
    ];
    expect(placeLineLabels(lines, 90, 1)).toEqual([{ x: 150, y: 0, angle: 0 }]);
    expect(placeLineLabels(lines, 90, 5)).toHaveLength(2);
  });
});
