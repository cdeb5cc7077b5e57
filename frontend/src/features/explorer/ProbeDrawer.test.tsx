import { describe, expect, it } from 'vitest';
import { fireEvent, render, screen, within } from '@testing-library/react';
import { App as AntdApp } from 'antd';
import { defaultSetup, levels, motionSettingsFromSetup, motionStates, teslaToAtomic, toHartree, hartreeTo, type LevelsInput, type MapSetup, type Tesla } from '@fieldbound/shared';
import { EnginePool } from '../../workers/enginePool';
import { FakeEngineWorker } from '../../workers/fakeWorkers';
import { probeMotionInputs } from '../../workers/probeMotion';
import { ProbeDrawer } from './ProbeDrawer';

// The probe worker's own call, run in the test (the shared engine, as the real worker runs it).
const engineWorker = () =>
  new FakeEngineWorker({
    async probeAt(input: LevelsInput, motionSetup: MapSetup) {
      const states = levels(input);
      const settings = motionSettingsFromSetup(motionSetup);
      return { levels: states, motion: settings ? motionStates({ fieldAu: input.fieldAu, states: probeMotionInputs(states), motion: settings }) : null };
    },
  }) as unknown as Worker;

/** Magnesium (α = 71.2 a₀³) at 20 T, r_c = 2 a₀, thermal ions at 4 K (the guide's probe). */
function thermalSetup(): MapSetup {
  const s = defaultSetup();
  return { ...s, shortRange: { ...s.shortRange, cutoffBohr: 2 }, orbitals: { mMax: 3 }, energyFloorKelvin: 1e-3, ion: { massNumber: 24 }, observationTimeSeconds: 1, motion: { kind: 'temperature', kelvin: 4 } };
}

function renderProbe(setup: MapSetup) {
  const pool = new EnginePool({ createWorker: engineWorker, size: 1 });
  render(
    <AntdApp>
      <div style={{ position: 'relative', width: 1280, height: 800 }}>
        <ProbeDrawer point={{ alpha: 71.2, tesla: 20 }} setup={setup} pool={pool} onClose={() => {}} />
      </div>
    </AntdApp>,
  );
  return screen.getByRole('dialog', { name: 'Probe' });
}

describe('ProbeDrawer', { timeout: 30_000 }, () => {
  it('keeps the state table’s headers and rows as the journeys read them, with every number on one line', async () => {
    const dialog = renderProbe(thermalSetup());
    const row = await within(dialog).findByRole('row', { name: /^0 0 / }, { timeout: 10_000 });
    const headers = within(dialog)
      .getAllByRole('columnheader')
      .map((h) => h.textContent ?? '');
    // (A trailing empty header may stand over the scroll bar.)
    expect(headers.filter((h) => h !== '')).toEqual(['m', 'ν', 'Binding energy (µeV)', 'Width Γ (µeV)', 'Lifetime ħ/Γ (s)', 'Class', 'ε/B', 'Flags']);

    const cells = within(row).getAllByRole('cell');
    const energy = cells[2].textContent ?? '';
    // The engine's own figure to the 4 figures shown (70.8 µeV: backend/src/demo/demo-answer.spec.ts).
    const fieldAu = teslaToAtomic(20 as Tesla) as number;
    const m0 = levels({ alpha: 71.2, fieldAu, cutoffBohr: 2, mMax: 3, energyFloorHartree: toHartree('K', 1e-3) }).find((s) => s.m === 0 && s.nu === 0)!;
    expect(Number(energy)).toBeCloseTo(hartreeTo('ueV', m0.bindingHartree as never) as number, 1);
    expect(cells[5].textContent).toMatch(/^bound.* % bound$/);
    // Numbers never break over lines; scientific ones keep "×" between narrow no-break spaces.
    for (const k of [2, 3, 4, 6]) {
      const span = cells[k].querySelector('span');
      expect(span?.style.whiteSpace, `column ${headers[k]}`).toBe('nowrap');
      expect(span?.style.fontVariantNumeric).toBe('tabular-nums');
      expect(cells[k].textContent).not.toMatch(/ × /);
    }
  });

  it('opens at a share of the explorer, widens and narrows from its header, and its edge drags within limits', async () => {
    const dialog = renderProbe(thermalSetup());
    const wrapper = dialog.closest<HTMLElement>('.ant-drawer-content-wrapper')!;
    const width = () => ({ width: wrapper.style.width, min: wrapper.style.minWidth, max: wrapper.style.maxWidth });
    expect(width()).toEqual({ width: '44%', min: '440px', max: '760px' });

    const wide = within(dialog).getByRole('button', { name: 'Wide probe view' });
    expect(wide.getAttribute('aria-pressed')).toBe('false');
    fireEvent.click(wide);
    expect(width()).toEqual({ width: 'calc(100% - 480px)', min: '440px', max: '' });
    expect(wide.getAttribute('aria-pressed')).toBe('true');
    fireEvent.click(wide);
    expect(width()).toEqual({ width: '44%', min: '440px', max: '760px' });
    // The header's only close button is still the drawer's own.
    expect(within(dialog).getAllByRole('button', { name: /close/i })).toHaveLength(1);

    // Dragging the left edge (happy-dom lays nothing out: the explorer is given its 1280 px, the drag starts from 0).
    Object.defineProperty(document.querySelector('.ant-drawer')!, 'clientWidth', { value: 1280 });
    const dragger = document.querySelector('.ant-drawer-resizable-dragger')!;
    fireEvent.mouseDown(dragger, { clientX: 1000 });
    fireEvent.mouseMove(document, { clientX: 400 });
    expect(width()).toEqual({ width: '600px', min: '', max: '' });
    // Never more than the explorer less 160 px of map, never less than 360 px.
    fireEvent.mouseMove(document, { clientX: -1000 });
    expect(wrapper.style.width).toBe('1120px');
    fireEvent.mouseMove(document, { clientX: 1200 });
    expect(wrapper.style.width).toBe('360px');
    fireEvent.mouseUp(document);
  });
});
