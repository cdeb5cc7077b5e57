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

  it('shows the stored 1000 a₀³ as 148.1847115 Å³ (10 significant figures)', () => {
    const initial = defaultSetup();
    initial.display.alphaUnit = 'A^3';
    render(<Harness initial={initial} onDraft={() => {}} />);
    expect((screen.getByTestId('alpha-max') as HTMLInputElement).value).toBe('148.1847115');
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

  it('reports a polarizability below the shared limit with the limit in a₀³', () => {
    render(<Harness initial={defaultSetup()} onDraft={() => {}} />);
    typeInto('alpha-min', '0.0001');
    expect(screen.getByText('polarizability minimum must be at least 0.001 a0^3')).toBeTruthy();
  });
});
