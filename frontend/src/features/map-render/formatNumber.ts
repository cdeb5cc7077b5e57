/**
 * Number formatting for the interface: scientific notation written as "2.4 × 10⁻⁹" with real
 * superscripts (never "2.4e-9"), plain decimals where they read better.
 */

const SUPERSCRIPT_DIGITS: Record<string, string> = {
  '0': '⁰', '1': '¹', '2': '²', '3': '³', '4': '⁴', '5': '⁵', '6': '⁶', '7': '⁷', '8': '⁸', '9': '⁹', '-': '⁻', '+': '⁺',
};

/** An integer written with superscript characters: superscript(-12) → "⁻¹²". */
export function superscript(n: number): string {
  return String(Math.trunc(n))
    .split('')
    .map((ch) => SUPERSCRIPT_DIGITS[ch] ?? ch)
    .join('');
}

/** "10ᵏ" for an integer exponent k: powerOfTen(-3) → "10⁻³". */
export function powerOfTen(exponent: number): string {
  return `10${superscript(exponent)}`;
}

/** Decimal exponent and mantissa of |x| rounded to `digits` significant figures (mantissa in [1, 10)). */
function splitScientific(x: number, digits: number): { mantissa: string; exponent: number } {
  const [m, e] = Math.abs(x).toExponential(Math.max(0, digits - 1)).split('e');
  return { mantissa: m, exponent: Number(e) };
}

/** Drops trailing zeros of a decimal fraction: "2.40" → "2.4", "3.0" → "3". */
function trimZeros(text: string): string {
  return text.includes('.') ? text.replace(/\.?0+$/, '') : text;
}

export interface FormatOptions {
  /** Significant figures. Default 3. */
  digits?: number;
  /** Keep trailing zeros (a measured value's precision). Default false. */
  keepZeros?: boolean;
  /** Plain decimals for magnitudes in [plainMin, plainMax). Default [1e-3, 1e4). */
  plainMin?: number;
  plainMax?: number;
}

/**
 * Formats a number for reading: plain decimal between 10⁻³ and 10⁴, otherwise "2.4 × 10⁻⁹".
 * A mantissa of exactly 1 is dropped ("10⁻⁹"). Minus signs are the typographic "−".
 * @example formatScientific(2.4e-9) // "2.4 × 10⁻⁹"
 * @example formatScientific(0.0421) // "0.0421"
 */
export function formatScientific(x: number, options: FormatOptions = {}): string {
  const digits = options.digits ?? 3;
  const plainMin = options.plainMin ?? 1e-3;
  const plainMax = options.plainMax ?? 1e4;
  if (Number.isNaN(x)) return '—';
  if (!Number.isFinite(x)) return x > 0 ? '∞' : '−∞';
  if (x === 0) return '0';
  const sign = x < 0 ? '−' : '';
  const ax = Math.abs(x);
  const { mantissa, exponent } = splitScientific(ax, digits);
  // Rounding can carry the value across the plain/scientific border (9999.6 → 1.00e4): decide on the rounded value.
  const rounded = Number(`${mantissa}e${exponent}`);
  if (rounded >= plainMin && rounded < plainMax) {
    const decimals = Math.max(0, digits - 1 - exponent);
    const text = rounded.toFixed(Math.min(decimals, 20));
    return sign + (options.keepZeros ? text : trimZeros(text));
  }
  const m = options.keepZeros ? mantissa : trimZeros(mantissa);
  return sign + (m === '1' ? powerOfTen(exponent) : `${m} × ${powerOfTen(exponent)}`);
}

/** A value with its unit label, separated by a thin no-break space: "2.4 × 10⁻⁹ µeV". */
export function formatWithUnit(x: number, unitLabel: string, options?: FormatOptions): string {
  return unitLabel ? `${formatScientific(x, options)}\u202f${unitLabel}` : formatScientific(x, options);
}

const FROM_SUPERSCRIPT: Record<string, string> = Object.fromEntries(Object.entries(SUPERSCRIPT_DIGITS).map(([k, v]) => [v, k]));

/**
 * Reads a number written by a person or by `formatScientific`: "2.4 × 10⁻⁹", "10⁻⁹", "2.4e-9", "2.4 x 10^-9",
 * "−3" (typographic minus). Returns NaN for anything else.
 */
export function parseScientific(text: string): number {
  const t = text.trim().replace(/−/g, '-').replace(/\u202f|\s/g, '');
  if (t === '') return Number.NaN;
  const m = /^([+-]?(?:\d+\.?\d*|\.\d+))?(?:[×x*]?10(?:\^([+-]?\d+)|([⁻⁺]?[⁰¹²³⁴⁵⁶⁷⁸⁹]+)))?$/.exec(t);
  if (m && (m[2] !== undefined || m[3] !== undefined)) {
    const mantissa = m[1] === undefined ? 1 : Number(m[1]);
    const exponent = m[2] !== undefined ? Number(m[2]) : Number([...m[3]].map((c) => FROM_SUPERSCRIPT[c]).join(''));
    return mantissa * 10 ** exponent;
  }
  return /^[+-]?(?:\d+\.?\d*|\.\d+)(?:e[+-]?\d+)?$/i.test(t) ? Number(t) : Number.NaN;
}
