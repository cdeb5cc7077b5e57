import { describe, expect, it } from 'vitest';
import { fireEvent, render, screen } from '@testing-library/react';
import { MapLegend, type MapLegendProps } from './MapLegend';

const props: MapLegendProps = { shown: { kind: 'survivors' }, maxCount: 3, energyUnitLabel: 'µeV', motionApplied: true, hasSpecies: true, hasFieldBands: false };
const body = () => screen.getByText('binding energy (µeV)').closest('div[hidden], aside > div:last-child') as HTMLElement;

describe('MapLegend folding', () => {
  it('is unfolded beside a wide map and folds to its title when the reader asks', () => {
    render(<MapLegend {...props} />);
    expect(body().hidden).toBe(false);
    fireEvent.click(screen.getByRole('button', { name: 'Fold the legend' }));
    expect(body().hidden).toBe(true);
    expect(screen.getByRole('complementary', { name: 'Legend' }).textContent).toContain('Survivors: states that last the observation time');
  });

  it("starts folded beside a narrow map, and the reader's choice holds when the map widens or narrows again", () => {
    const { rerender } = render(<MapLegend {...props} narrow />);
    expect(body().hidden).toBe(true);
    fireEvent.click(screen.getByRole('button', { name: 'Unfold the legend' }));
    expect(body().hidden).toBe(false);
    rerender(<MapLegend {...props} />);
    rerender(<MapLegend {...props} narrow />);
    expect(body().hidden).toBe(false);
    expect(screen.getByRole('button', { name: 'Fold the legend' }).getAttribute('aria-expanded')).toBe('true');
  });
});
