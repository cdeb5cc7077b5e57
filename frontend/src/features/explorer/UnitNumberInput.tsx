import { useRef, useState } from 'react';
import { Input } from 'antd';
import { formatScientific, parseScientific } from '../map-render/formatNumber';

/** Significant figures a converted value is shown with (the stored value keeps every digit). */
export const INPUT_DIGITS = 6;

/**
 * Text of a number in an input: 6 significant figures, plain between 10⁻⁴ and 10⁶, otherwise "2.4 × 10⁻⁹" (which
 * `parseScientific` reads back). Integers are written in full.
 * @example numberInputText(0.08617333262) // "0.0861733"
 */
export function numberInputText(x: number | undefined, integer = false): string {
  if (x === undefined || !Number.isFinite(x)) return '';
  if (integer && Number.isInteger(x)) return String(x);
  return formatScientific(x, { digits: INPUT_DIGITS, plainMin: 1e-4, plainMax: 1e6 });
}

export interface UnitNumberInputProps {
  /** The stored (canonical) value; undefined or NaN while the field is empty or unreadable. */
  value: number | undefined;
  toDisplay?: (canonical: number) => number;
  fromDisplay?: (shown: number) => number;
  /** Called with the canonical value of what was typed: undefined for an empty field, NaN for text that is no number. */
  onChange: (canonical: number | undefined) => void;
  suffix?: string;
  integer?: boolean;
  'aria-label'?: string;
  'data-testid'?: string;
  status?: 'error';
  style?: React.CSSProperties;
}

/**
 * A number typed in the unit the user picked, stored in the canonical unit. The value is shown rounded to 6
 * significant figures (an energy floor of 10⁻³ K reads 0.0861733 µeV, not 0.08617333262), but the stored value is
 * only replaced when the person actually changes the text: focusing and leaving the field, or switching units,
 * keeps every digit of the stored number.
 */
export function UnitNumberInput({ value, toDisplay = (x) => x, fromDisplay = (x) => x, onChange, suffix, integer, status, style, ...rest }: UnitNumberInputProps) {
  const shown = value === undefined || !Number.isFinite(value) ? '' : numberInputText(toDisplay(value), integer);
  const [editing, setEditing] = useState<string | null>(null);
  // What was shown, and the stored value, when the field got the focus.
  const untouched = useRef<{ text: string; value: number | undefined } | null>(null);
  return (
    <Input
      value={editing ?? shown}
      suffix={suffix}
      status={status}
      inputMode="decimal"
      style={{ width: '100%', ...style }}
      aria-label={rest['aria-label']}
      data-testid={rest['data-testid']}
      onFocus={() => {
        untouched.current = { text: shown, value };
        setEditing(shown);
      }}
      onBlur={() => {
        untouched.current = null;
        setEditing(null);
      }}
      onChange={(e) => {
        const text = e.target.value;
        setEditing(text);
        // Typing back exactly what was shown means no change: the stored value keeps its digits.
        if (untouched.current && text === untouched.current.text) {
          onChange(untouched.current.value);
          return;
        }
        if (text.trim() === '') {
          onChange(undefined);
          return;
        }
        const v = parseScientific(text);
        onChange(Number.isFinite(v) ? fromDisplay(v) : Number.NaN);
      }}
    />
  );
}
