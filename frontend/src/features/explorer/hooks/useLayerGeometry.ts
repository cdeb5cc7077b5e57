import { useEffect, useState } from 'react';
import type { BindingMapResult, PhaseMapResult } from '@fieldbound/shared';
import type { ContourClient } from '../../../workers/contourClient';
import type { MapComputeError } from '../../../workers/engineContract';
import { kelvinToHartree } from '../../map-render/displayUnits';
import { mapFields, type MapGeometry } from '../../map-render/mapGeometry';
import type { ShownQuantity } from '../../map-render/regionField';

/**
 * Contours of one result for the shown quantity and the contour levels, computed in the contour worker. Only the
 * two per-cell fields travel (transferred). Keeps the previous geometry until the new one arrives.
 */
export function useLayerGeometry(
  client: ContourClient | null,
  result: BindingMapResult | null,
  phase: PhaseMapResult | null,
  shown: ShownQuantity,
  levelsKelvin: readonly number[],
): { geometry: MapGeometry | null; forResult: BindingMapResult | null; error: MapComputeError | null } {
  const [state, setState] = useState<{ geometry: MapGeometry | null; forResult: BindingMapResult | null; error: MapComputeError | null }>({ geometry: null, forResult: null, error: null });
  const shownKey = shown.kind === 'survivors' ? 's' : `m${shown.m}`;
  const levelsKey = levelsKelvin.join(',');
  useEffect(() => {
    if (!client || !result) {
      setState({ geometry: null, forResult: null, error: null });
      return;
    }
    let live = true;
    const fields = mapFields(result, phase, shownKey === 's' ? { kind: 'survivors' } : { kind: 'orbital', m: Number(shownKey.slice(1)) }, levelsKey ? levelsKey.split(',').map(Number) : [], kelvinToHartree);
    client.geometry(fields).then(
      (geometry) => live && setState({ geometry, forResult: result, error: null }),
      (error: MapComputeError) => live && setState((s) => ({ ...s, error })),
    );
    return () => {
      live = false;
    };
  }, [client, result, phase, shownKey, levelsKey]);
  return state;
}
