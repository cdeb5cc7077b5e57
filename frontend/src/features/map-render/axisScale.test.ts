import { describe, expect, it } from 'vitest';
import { axisTicks, makeAxisScale } from './axisScale';

const labels = (ticks: { label: string }[]) => ticks.map((t) => t.label).filter(Boolean);

describe('axisTicks on log axes', () => {
  it('labels every power of ten of 10⁻³…10² with superscripts', () => {
    const ticks = axisTicks('log', [1e-3, 100]);
    expect(labels(ticks)).toEqual(['10⁻³', '10⁻²', '10⁻¹', '10⁰', '10¹', '10²']);
  });
  it('puts unlabelled minor ticks at 2…9 × 10ᵏ inside the domain of 1…1000', () => {
    const ticks = axisTicks('log', [1, 1000]);
    const minors = ticks.filter((t) => !t.major).map((t) => t.value);
    expect(minors).toHaveLength(24); // 2…9 in each of three decades
    expect(minors).toContain(2);
    expect(minors).toContain(900);
    expect(ticks.filter((t) => t.major).map((t) => t.value)).toEqual([1, 10, 100, 1000]);
  });
  it('labels every second decade of 10⁻³…10⁹ (12 decades, 6 labels) and drops minors', () => {
    const ticks = axisTicks('log', [1e-3, 1e9], 6);
    expect(labels(ticks)).toEqual(['10⁻³', '10⁻¹', '10¹', '10³', '10⁵', '10⁷', '10⁹']);
    expect(ticks.every((t) => Math.log10(t.value) % 1 === 0)).toBe(true);
  });
  it('labels 1, 2, 5 multiples on a field axis of 1…45 T', () => {
    expect(labels(axisTicks('log', [1, 45]))).toEqual(['1', '2', '5', '10', '20']);
  });
  it('falls back to round linear ticks when the log axis spans less than half a decade', () => {
    expect(labels(axisTicks('log', [10, 20], 5))).toEqual(['10', '12', '14', '16', '18', '20']);
  });
  it('writes large values on short log axes in scientific notation', () => {
    expect(labels(axisTicks('log', [1e7, 1e9]))).toEqual(['10⁷', '10⁸', '10⁹']);
    // Under 1.2 decades the labels get denser: 1, 2, 3, 5, 7.
    expect(labels(axisTicks('log', [1e7, 9e7]))).toEqual(['10⁷', '2 × 10⁷', '3 × 10⁷', '5 × 10⁷', '7 × 10⁷']);
  });
});

describe('axisTicks on linear axes', () => {
  it('gives round ticks labelled without e-notation', () => {
    expect(labels(axisTicks('linear', [0, 1e6], 5))).toEqual(['0', '2 × 10⁵', '4 × 10⁵', '6 × 10⁵', '8 × 10⁵', '10⁶']);
  });
});

describe('makeAxisScale', () => {
  it('maps a log domain evenly in decades onto the pixel range', () => {
    const s = makeAxisScale('log', [1, 1000], [0, 300]);
    expect(s(10)).toBeCloseTo(100, 10);
    expect(s(100)).toBeCloseTo(200, 10);
  });
  it('maps a linear domain proportionally, including a reversed (upward) range', () => {
    const s = makeAxisScale('linear', [0, 50], [400, 0]);
    expect(s(25)).toBeCloseTo(200, 10);
  });
});
