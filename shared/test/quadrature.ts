/**
 * Adaptive Gauss–Kronrod (7/15-point) quadrature for tests: an independent route to
 * the integrals the engine evaluates in closed form. Nodes and weights of the 15-point
 * Kronrod extension of the 7-point Gauss rule as in QUADPACK's QK15
 * (R. Piessens, E. de Doncker-Kapenga, C. W. Überhuber, D. K. Kahaner, QUADPACK, Springer 1983).
 */
const XGK = [
  0.991455371120812639206854697526329, 0.949107912342758524526189684047851, 0.864864423359769072789712788640926,
  0.741531185599394439863864773280788, 0.586087235467691130294144845693013, 0.405845151377397166906606412076961,
  0.207784955007898467600689403773245, 0,
];
const WGK = [
  0.02293532201052922496373200805897, 0.063092092629978553290700663189204, 0.104790010322250183839876322541518,
  0.140653259715525918745189590510238, 0.16900472663926790282658342659855, 0.190350578064785409913256402421014,
  0.204432940075298892414161999234649, 0.209482141084727828012999174891714,
];
const WG = [
  0.129484966168869693270611432679082, 0.27970539148927666790146777142378, 0.381830050505118944950369775488975,
  0.417959183673469387755102040816327,
];

function gk15(f: (x: number) => number, a: number, b: number): { k: number; err: number } {
  const c = 0.5 * (a + b);
  const h = 0.5 * (b - a);
  const fc = f(c);
  let k = WGK[7]! * fc;
  let g = WG[3]! * fc;
  for (let j = 0; j < 7; j++) {
    const dx = h * XGK[j]!;
    const s = f(c - dx) + f(c + dx);
    k += WGK[j]! * s;
    if (j % 2 === 1) g += WG[(j - 1) / 2]! * s;
  }
  return { k: k * h, err: Math.abs((k - g) * h) };
}

/**
 * ∫_a^b f(x) dx by recursive bisection until each piece meets
 * |K15 − G7| ≤ max(relTol·|K15|, absTol, 1e-2·relTol·|I₀|),
 * I₀ the first estimate over [a, b] (so an integrable endpoint singularity cannot stall it).
 * Throws if the recursion depth is exhausted (so a failing quadrature never passes silently).
 */
export function integrate(f: (x: number) => number, a: number, b: number, relTol = 1e-14, absTol = 0): number {
  const first = gk15(f, a, b);
  const floor = 1e-2 * relTol * Math.abs(first.k);
  const rec = (lo: number, hi: number, est: { k: number; err: number }, depth: number): number => {
    if (est.err <= Math.max(relTol * Math.abs(est.k), absTol, floor) || est.err < 1e-300) return est.k;
    if (depth === 0) throw new Error(`integrate: no convergence on [${lo}, ${hi}] (estimate ${est.k}, error ${est.err})`);
    const c = 0.5 * (lo + hi);
    return rec(lo, c, gk15(f, lo, c), depth - 1) + rec(c, hi, gk15(f, c, hi), depth - 1);
  };
  return rec(a, b, first, 80);
}

/** ∫ over consecutive breakpoints, then [last, ∞) by x = last + t/(1 − t). */
export function integrateToInfinity(
  f: (x: number) => number,
  breakpoints: number[],
  relTol = 1e-14,
): number {
  const pts = [...breakpoints].sort((p, q) => p - q);
  let sum = 0;
  for (let i = 0; i + 1 < pts.length; i++) {
    if (pts[i + 1]! > pts[i]!) sum += integrate(f, pts[i]!, pts[i + 1]!, relTol, Math.abs(sum) * relTol * 1e-2);
  }
  const a = pts[pts.length - 1]!;
  const tail = integrate(
    (t) => {
      if (t >= 1) return 0;
      const u = 1 - t;
      return f(a + t / u) / (u * u);
    },
    0,
    1,
    relTol,
    Math.abs(sum) * relTol * 1e-2,
  );
  return sum + tail;
}
