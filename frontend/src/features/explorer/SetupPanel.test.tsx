import { describe, expect, it } from 'vitest';
import { useState } from 'react';
import { fireEvent, render, screen } from '@testing-library/react';
import { defaultSetup, validateSetup, type MapSetup } from '@fieldbound/shared';
import { SetupPanel } from './SetupPanel';
import type { SetupDraft } from './setupDraft';

/** Published conversion (CODATA 2018): 1 a₀³ = 0.1481847113 Å³ (a₀ = 0.529177210903 Å, cubed). */
const ANGSTROM3_PER_BOHR3_CODATA2018 = 0.1481847113;

function Harness({ initial, onDraft }: { initial: MapSetup; onDraft: (d: SetupDraft) => void }) {
  const [draft, setDraft] = useState<SetupDraft>(initial);
  const check = validateSetup(draft);
  return (
    <SetupPanel
      draft={draft}
      issues={check.ok ? [] : check.issues}
      needsCompute={false}
      onCompute={() => {}}
      onChange={(d) => {
        setDraft(d);
        onDraft(d);
      }}
    />
  );
}

function typeInto(testId: string, text: string) {
  const input = screen.getByTestId(testId) as HTMLInputElement;
  fireEvent.focus(input);
  fireEvent.change(input, { target: { value: text } });
  fireEvent.blur(input);
}

function typeIntoLabel(label: string, text: string) {
  const input = screen.getByLabelText(label) as HTMLInputElement;
  fireEvent.focus(input);
  fireEvent.change(input, { target: { value: text } });
  fireEvent.blur(input);
}

// antd forms render slowly in happy-dom (seconds on a busy machine): allow time, the checks themselves are exact.
describe('SetupPanel unit conversions', { timeout: 30_000 }, () => {
  it('stores 10 Å³ typed as the polarizability minimum as 67.48… a₀³', () => {
    let last: SetupDraft | null = null;
    const initial = defaultSetup();
    initial.display.alphaUnit = 'A^3';
    render(<Harness initial={initial} onDraft={(d) => (last = d)} />);
    typeInto('alpha-min', '10');
    const expected = 10 / ANGSTROM3_PER_BOHR3_CODATA2018; // 67.4833…
    expect(last!.alphaAxis.min).toBeCloseTo(expected, 6);
    expect(last!.alphaAxis.min / expected - 1).toBeLessThan(1e-9);
  });

  it('shows the stored 1000 a₀³ as 148.185 Å³ (6 significant figures)', () => {
    const initial = defaultSetup();
    initial.display.alphaUnit = 'A^3';
    render(<Harness initial={initial} onDraft={() => {}} />);
    expect((screen.getByTestId('alpha-max') as HTMLInputElement).value).toBe('148.185');
  });

  it('shows the 10⁻³ K energy floor as 0.0861733 µeV and keeps the stored value exact when the field is only visited', () => {
    let last: SetupDraft | null = null;
    render(<Harness initial={defaultSetup()} onDraft={(d) => (last = d)} />);
    // 10⁻³ K · k_B = 0.08617333262 µeV (CODATA 2018: k_B = 8.617333262 × 10⁻⁵ eV/K).
    const floor = screen.getByLabelText('Energy floor (weaker binding counts as unbound)') as HTMLInputElement;
    expect(floor.value).toBe('0.0861733');
    fireEvent.focus(floor);
    fireEvent.change(floor, { target: { value: '0.086173' } });
    fireEvent.change(floor, { target: { value: '0.0861733' } }); // typed back as shown: no change
    fireEvent.blur(floor);
    expect(last!.energyFloorKelvin).toBe(1e-3);
  });

  it('stores a typed energy in kelvin: 1 µeV typed as the floor is 1 / 86.17333262 K', () => {
    let last: SetupDraft | null = null;
    render(<Harness initial={defaultSetup()} onDraft={(d) => (last = d)} />);
    typeIntoLabel('Energy floor (weaker binding counts as unbound)', '1');
    // k_B = 86.17333262 µeV/K (CODATA 2018, exact since 2019).
    expect(Math.abs(last!.energyFloorKelvin / (1 / 86.17333262) - 1)).toBeLessThan(1e-9);
  });

  it('reads scientific notation as shown: "2 × 10⁻⁴" µeV', () => {
    let last: SetupDraft | null = null;
    render(<Harness initial={defaultSetup()} onDraft={(d) => (last = d)} />);
    typeIntoLabel('Energy floor (weaker binding counts as unbound)', '2 × 10⁻⁴');
    expect(Math.abs((last!.energyFloorKelvin * 86.17333262) / 2e-4 - 1)).toBeLessThan(1e-9);
  });

  it('keeps the stored contour levels exactly when their field is visited without a change', () => {
    let last: SetupDraft | null = null;
    render(<Harness initial={defaultSetup()} onDraft={(d) => (last = d)} />);
    const levels = screen.getByLabelText('Binding-energy contours') as HTMLInputElement;
    fireEvent.focus(levels);
    fireEvent.blur(levels);
    expect(last).toBeNull();
    fireEvent.change(levels, { target: { value: '1, 10' } });
    fireEvent.blur(levels);
    expect(last!.contours.levelsKelvin.map((k) => k * 86.17333262)).toEqual([expect.closeTo(1, 9), expect.closeTo(10, 8)]);
  });

  it('stores a field typed in atomic units in tesla (0.001 a.u. → 235.05… T)', () => {
    let last: SetupDraft | null = null;
    const initial = defaultSetup();
    initial.display.fieldUnit = 'au';
    render(<Harness initial={initial} onDraft={(d) => (last = d)} />);
    typeInto('field-max', '0.001');
    expect(last!.fieldAxis.max).toBeCloseTo(235.0517567581, 9);
  });
});

describe('SetupPanel validation messages', { timeout: 30_000 }, () => {
  it('shows the setup rules’ message beside the field when the range is inverted', () => {
    render(<Harness initial={defaultSetup()} onDraft={() => {}} />);
    typeInto('alpha-max', '0.5');
    expect(screen.getByText('polarizability range is inverted or empty: minimum must be below maximum')).toBeTruthy();
    expect(screen.getByText('One setting needs attention.')).toBeTruthy();
  });

  it('says a cleared field is required, and the setup is valid again once a value is typed', () => {
    render(<Harness initial={defaultSetup()} onDraft={() => {}} />);
    typeInto('field-min', '');
    expect(screen.getByText('field minimum is required')).toBeTruthy();
    typeInto('field-min', '2');
    // (antd animates the old message out, so check the summary, which goes at once.)
    expect(screen.queryByText('One setting needs attention.')).toBeNull();
  });

  it('says what is wrong with text that is no number', () => {
    render(<Harness initial={defaultSetup()} onDraft={() => {}} />);
    typeInto('alpha-min', 'ten');
    expect(screen.getByText('polarizability minimum must be a number')).toBeTruthy();
  });

  it('reports a polarizability below the shared limit with the limit in a₀³', () => {
    render(<Harness initial={defaultSetup()} onDraft={() => {}} />);
    typeInto('alpha-min', '0.0001');
    expect(screen.getByText('polarizability minimum must be at least 0.001 a0^3')).toBeTruthy();
  });
});
