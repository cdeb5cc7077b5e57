import { describe, expect, it } from 'vitest';
import { expectClose } from './expectClose.js';
import { integrate, integrateToInfinity } from './quadrature.js';

describe('test quadrature (adaptive Gauss–Kronrod 7/15)', () => {
  it('integrates x^20 on [0, 1] to 1/21 within 1e-14 (elementary calculus)', () => {
    expectClose(integrate((x) => x ** 20, 0, 1), 1 / 21, { rel: 1e-14, inputs: 'x^20 on [0,1]' });
  });
  it('integrates 1/(1+x²) on [0, ∞) to π/2 within 1e-13 (elementary calculus)', () => {
    expectClose(integrateToInfinity((x) => 1 / (1 + x * x), [0, 1, 10]), Math.PI / 2, { rel: 1e-13, inputs: '1/(1+x²)' });
  });
  it('integrates e^(−x) x^(1/2) on [0, ∞) to Γ(3/2) = √π/2 within 1e-12 (DLMF 5.2.1)', () => {
    expectClose(integrateToInfinity((x) => Math.exp(-x) * Math.sqrt(x), [0, 1e-6, 1e-3, 0.1, 1, 10, 40]), Math.sqrt(Math.PI) / 2, {
      rel: 1e-12,
      inputs: 'e^-x sqrt(x)',
    });
  });
  it('expectClose reports inputs, expected, actual, difference and tolerance on failure', () => {
    expect(() => expectClose(1.1, 1, { rel: 1e-3, inputs: { x: 1 }, source: 'test' })).toThrow(/inputs:.*x=1[\s\S]*expected[\s\S]*actual[\s\S]*difference[\s\S]*tolerance/);
  });
});
