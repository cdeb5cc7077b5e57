/**
 * Compact number for terminal tables: 6 significant digits, exponent form outside 1e-3…1e6
 * with trailing zeros dropped (2.4e-9, 0.0985714, 36.5383, 2.35052e+5). Non-finite values print as 'n/a'.
 *
 * @example
 * formatNumber(2.4e-9) // '2.4e-9'
 */
export function formatNumber(x: number, digits = 6): string {
  if (!Number.isFinite(x)) return 'n/a';
  const a = Math.abs(x);
  if (a !== 0 && (a < 1e-3 || a >= 1e6)) {
    const [mant, exp] = x.toExponential(digits - 1).split('e');
    return `${mant.includes('.') ? mant.replace(/\.?0+$/, '') : mant}e${exp}`;
  }
  return String(Number(x.toPrecision(digits)));
}
