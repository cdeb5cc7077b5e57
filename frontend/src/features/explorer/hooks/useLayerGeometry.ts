import { useLayoutEffect, useState } from 'react';
import type { BindingMapResult, MapSetup, PhaseMapResult } from '@fieldbound/shared';
import type { ContourClient } from '../../../workers/contourClient';
import type { MapComputeError } from '../../../workers/engineContract';
import { kelvinToHartree } from '../../map-render/displayUnits';
import { mapFields, type MapGeometry } from '../../map-render/mapGeometry';
import type { ShownQuantity } from '../../map-render/regionField';

export interface LayerGeometry {
  geometry: MapGeometry | null;
  /** The result (and the setup of its grid) the geometry was drawn from: it may lag behind the newest result. */
  forResult: BindingMapResult | null;
  forSetup: MapSetup | null;
  /** The moving-ion classes it was drawn with. */
  forPhase: PhaseMapResult | null;
  error: MapComputeError | null;
}

const NONE: LayerGeometry = { geometry: null, forResult: null, forSetup: null, forPhase: null, error: null };

/**
 * Contours of one result for the shown quantity and the contour levels, computed in the contour worker. Only the
 * two per-cell fields travel (transferred). Keeps the previous geometry until the new one arrives, so a finer
 * result replaces a coarser one in place. With ion motion wanted (`motionWanted`) a result is drawn only once its
 * classes are there, so the picture never flashes the fixed-atom regions while motion settings are applied.
 */
export function useLayerGeometry(
  client: ContourClient | null,
  result: BindingMapResult | null,
  resultSetup: MapSetup | null,
  phase: PhaseMapResult | null,
  shown: ShownQuantity,
  levelsKelvin: readonly number[],
  motionWanted: boolean,
): LayerGeometry {
  const [state, setState] = useState<LayerGeometry>(NONE);
  const shownKey = shown.kind === 'survivors' ? 's' : `m${shown.m}`;
  const levelsKey = levelsKelvin.join(',');
  // A layout effect: the request leaves in the commit that brings the result, not after the next paint.
  useLayoutEffect(() => {
    if (!client || !result || !resultSetup) {
      setState(NONE);
      return;
    }
    if (motionWanted && !phase) return;
    let live = true;
    const fields = mapFields(result, phase, shownKey === 's' ? { kind: 'survivors' } : { kind: 'orbital', m: Number(shownKey.slice(1)) }, levelsKey ? levelsKey.split(',').map(Number) : [], kelvinToHartree);
    client.geometry(fields).then(
      (geometry) => live && setState({ geometry, forResult: result, forSetup: resultSetup, forPhase: phase, error: null }),
      (error: MapComputeError) => live && setState((s) => ({ ...s, error })),
    );
    return () => {
      live = false;
    };
  }, [client, result, resultSetup, phase, shownKey, levelsKey, motionWanted]);
  return state;
}
