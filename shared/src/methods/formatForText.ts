const SUPERSCRIPT: Record<string, string> = {
  '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹', '-': '⁻', '+': '',
};

function withTimesTen(mantissa: string, exponent: string): string {
  const e = exponent.replace(/^\+/, '');
  const power = `10${[...e].map((c) => SUPERSCRIPT[c] ?? c).join('')}`;
  return mantissa === '1' ? power : `${mantissa} × ${power}`;
}

/**
 * A number exactly as stored (the shortest text that reads back to the same double), written for a
 * paper: "45", "0.001", "2.5 × 10⁻⁷", "10⁹".
 *
 * @example
 * exactText(2.5e-7) // '2.5 × 10⁻⁷'
 */
export function exactText(v: number): string {
  const s = String(v);
  const m = /^(-?[\d.]+)e([+-]\d+)$/.exec(s);
  if (m) return withTimesTen(m[1], m[2]);
  // Long runs of zeros read better as powers of ten.
  if (Math.abs(v) >= 1e6 || (v !== 0 && Math.abs(v) < 1e-4)) {
    const [mant, exp] = v.toExponential().split('e');
    return withTimesTen(mant, exp);
  }
  return s;
}

/**
 * A derived number to `digits` significant figures: "2.351 × 10⁵", "0.1482", "12.0".
 *
 * @example
 * approxText(235051.7567581, 4) // '2.351 × 10⁵'
 */
export function approxText(v: number, digits = 4): string {
  if (v === 0 || !Number.isFinite(v)) return String(v);
  const a = Math.abs(v);
  if (a >= 1e-3 && a < 1e4) return v.toPrecision(digits).replace(/(\.\d*?[1-9])0+$|\.0+$/, '$1');
  const [mant, exp] = v.toExponential(digits - 1).split('e');
  return withTimesTen(mant.replace(/(\.\d*?[1-9])0+$|\.0+$/, '$1'), exp);
}
