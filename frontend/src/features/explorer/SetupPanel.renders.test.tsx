import { describe, expect, it, vi } from 'vitest';
import { useState } from 'react';
import { act, fireEvent, render, screen } from '@testing-library/react';
import { defaultSetup, validateSetup, type MapSetup } from '@fieldbound/shared';
import type { UnitNumberInputProps } from './UnitNumberInput';
import { SetupPanel } from './SetupPanel';
import type { SetupDraft } from './setupDraft';

// Every number input of the form counts its renders (by test id, else by label): the real input, called in place.
const renders = vi.hoisted(() => new Map<string, number>());
vi.mock('./UnitNumberInput', async (importOriginal) => {
  const actual = await importOriginal<typeof import('./UnitNumberInput')>();
  return {
    ...actual,
    UnitNumberInput: (props: UnitNumberInputProps) => {
      const key = props['data-testid'] ?? props['aria-label'] ?? '?';
      renders.set(key, (renders.get(key) ?? 0) + 1);
      return actual.UnitNumberInput(props);
    },
  };
});

/** As the explorer holds it: the draft lifted to the parent, validated there with the server's rules on every change. */
function Harness({ initial, expose }: { initial: MapSetup; expose: (set: (update: (d: SetupDraft) => SetupDraft) => void) => void }) {
  const [draft, setDraft] = useState<SetupDraft>(initial);
  expose(setDraft);
  const check = validateSetup(draft);
  return <SetupPanel draft={draft} issues={check.ok ? [] : check.issues} needsCompute={false} onCompute={() => {}} onChange={setDraft} />;
}

const ALL_FIELDS = ['alpha-min', 'alpha-max', 'field-min', 'field-max', 'Columns (α)', 'Rows (B)', 'Highest orbital m', 'Cutoff radius r_c (regularized polarization potential)', 'Energy floor (weaker binding counts as unbound)', 'Ion mass number', 'Observation time'];

function snapshot(): Record<string, number> {
  return Object.fromEntries(ALL_FIELDS.map((k) => [k, renders.get(k) ?? 0]));
}

/** Fields whose render count changed since `before`. */
function rerendered(before: Record<string, number>): string[] {
  const now = snapshot();
  return ALL_FIELDS.filter((k) => now[k] !== before[k]);
}

function mount(initial = defaultSetup()) {
  renders.clear();
  let setDraft: (update: (d: SetupDraft) => SetupDraft) => void = () => {};
  render(<Harness initial={initial} expose={(set) => (setDraft = set)} />);
  for (const k of ALL_FIELDS) expect(renders.get(k), `${k} is drawn`).toBeGreaterThan(0);
  return { setDraft: (update: (d: SetupDraft) => SetupDraft) => act(() => setDraft(update)) };
}

// antd forms render slowly in happy-dom (seconds on a busy machine): allow time; the checks are render counts, not timings.
describe('SetupPanel re-renders', { timeout: 30_000 }, () => {
  it('a keystroke re-renders the field typed in and none of the other fields, however many keys are typed', () => {
    mount();
    const input = screen.getByTestId('alpha-min') as HTMLInputElement;
    fireEvent.focus(input);
    const before = snapshot();
    for (const text of ['2', '20', '200', '20', '2']) fireEvent.change(input, { target: { value: text } });
    expect(rerendered(before)).toEqual(['alpha-min']);
    expect(input.value).toBe('2');
  });

  it('a keystroke that breaks a rule re-renders the fields that show its message, and the message is the setup rules’ own', () => {
    mount();
    const max = screen.getByTestId('alpha-max') as HTMLInputElement;
    fireEvent.focus(max);
    const before = snapshot();
    fireEvent.change(max, { target: { value: '0.5' } });
    expect(screen.getByText('polarizability range is inverted or empty: minimum must be below maximum')).toBeTruthy();
    const changed = rerendered(before);
    expect(changed).toContain('alpha-max');
    // Only the polarizability range can carry that message; nothing outside it re-renders.
    expect(changed.every((k) => k === 'alpha-min' || k === 'alpha-max')).toBe(true);
  });

  it('typing text that is no number marks only that field', () => {
    mount();
    const cutoff = screen.getByLabelText('Cutoff radius r_c (regularized polarization potential)') as HTMLInputElement;
    fireEvent.focus(cutoff);
    const before = snapshot();
    fireEvent.change(cutoff, { target: { value: 'two' } });
    expect(screen.getByText(/cutoff.*must be a number/i)).toBeTruthy();
    expect(rerendered(before)).toEqual(['Cutoff radius r_c (regularized polarization potential)']);
  });

  it('a new polarizability unit re-renders the two polarizability fields (in the new unit) and nothing else', () => {
    const { setDraft } = mount();
    const before = snapshot();
    setDraft((d) => ({ ...d, display: { ...d.display, alphaUnit: 'A^3' } }));
    expect(rerendered(before).sort()).toEqual(['alpha-max', 'alpha-min']);
    // 1000 a₀³ = 148.185 Å³ (CODATA 2018 a₀).
    expect((screen.getByTestId('alpha-max') as HTMLInputElement).value).toBe('148.185');
  });

  it('a new energy unit re-renders the energy floor only, which then reads in that unit', () => {
    const { setDraft } = mount();
    const before = snapshot();
    setDraft((d) => ({ ...d, display: { ...d.display, energyUnit: 'K' } }));
    expect(rerendered(before)).toEqual(['Energy floor (weaker binding counts as unbound)']);
    expect((screen.getByLabelText('Energy floor (weaker binding counts as unbound)') as HTMLInputElement).value).toBe('0.001');
  });
});
