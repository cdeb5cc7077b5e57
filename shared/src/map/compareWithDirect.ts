import { levels } from '../levels/levels.js';
import type { MapSetup } from '../setup/mapSetup.js';
import { toHartree } from '../units/convert.js';
import { MAP_FLAG, type BindingMapResult } from './mapTypes.js';

/** One disagreement between a map cell and the direct solve of that point. */
export interface CellMismatch {
  cell: number;
  m: number;
  what: string;
}

/** Result of `compareWithDirect`. */
export interface DirectComparison {
  /** Largest relative difference |ε_map − ε_direct|/ε_direct over the compared states. */
  worstRelError: number;
  /** Where the worst difference occurred. */
  worst: { cell: number; m: number; nu: number; alpha: number; fieldAu: number; map: number; direct: number } | null;
  /** States compared (above the floor in the direct solve). */
  statesCompared: number;
  /** Count, flag or value disagreements beyond `tolerance`. */
  mismatches: CellMismatch[];
}

/**
 * Checks map cells against direct per-point solves (`levels`, the reference of issue 3 item 6): for
 * each listed cell and orbital, every state the direct solve keeps (not flagged below-floor) must be
 * in the map within `tolerance` relative; the count must equal the number of kept states; the map
 * stores 0 for the rest; BELOW_FLOOR, CUTOFF_DOMINATED and NON_ADIABATIC must match the direct
 * flags. States within `tolerance` of the floor may fall on either side and are skipped.
 *
 * @example
 * compareWithDirect(setup, bindingMap(setup), [0, 17, 99]).worstRelError // ≲ 1e-6
 */
export function compareWithDirect(setup: MapSetup, map: BindingMapResult, cells: readonly number[], tolerance = 1e-6): DirectComparison {
  const floor = toHartree('K', setup.energyFloorKelvin);
  const rc = setup.shortRange.cutoffBohr;
  const { nAlpha, cellCount, levelsPerOrbital: L, mMax } = map;
  let worstRelError = 0;
  let worst: DirectComparison['worst'] = null;
  let statesCompared = 0;
  const mismatches: CellMismatch[] = [];
  for (const cell of cells) {
    const i = cell % nAlpha;
    const j = (cell - i) / nAlpha;
    const alpha = map.alphas[i];
    const B = map.fieldsAu[j];
    const direct = levels({ alpha, fieldAu: B, cutoffBohr: rc, mMax, energyFloorHartree: floor });
    for (let m = 0; m <= mMax; m++) {
      const st = direct.filter((s) => s.m === m);
      const kept = st.filter((s) => !s.flags.includes('below-floor'));
      const nearFloor = st.some((s) => Math.abs(s.bindingHartree - floor) <= tolerance * Math.max(floor, 1e-300) * 2);
      const count = map.counts[m * cellCount + cell];
      const flags = map.flags[m * cellCount + cell];
      const where = `alpha=${alpha} B=${B}au`;
      if (count !== kept.length && !nearFloor) mismatches.push({ cell, m, what: `count ${count} ≠ direct ${kept.length} (${where})` });
      const dropped = st.length > kept.length;
      if (!nearFloor && ((flags & MAP_FLAG.BELOW_FLOOR) !== 0) !== dropped) {
        mismatches.push({ cell, m, what: `BELOW_FLOOR ${(flags & MAP_FLAG.BELOW_FLOOR) !== 0} ≠ direct ${dropped} (${where})` });
      }
      const cut = st.some((s) => s.flags.includes('cutoff-dominated'));
      if (((flags & MAP_FLAG.CUTOFF_DOMINATED) !== 0) !== cut) mismatches.push({ cell, m, what: `CUTOFF_DOMINATED ≠ direct ${cut} (${where})` });
      const nonAd = kept.some((s) => s.flags.includes('non-adiabatic'));
      const nonAdEdge = kept.some((s) => Math.abs(s.bindingOverB / 0.1 - 1) <= tolerance * 2);
      if (!nonAdEdge && ((flags & MAP_FLAG.NON_ADIABATIC) !== 0) !== nonAd) mismatches.push({ cell, m, what: `NON_ADIABATIC ≠ direct ${nonAd} (${where})` });
      for (let nu = 0; nu < L; nu++) {
        const v = map.bindingHartree[(m * L + nu) * cellCount + cell];
        const d = kept.find((s) => s.nu === nu);
        if (d === undefined) {
          if (v !== 0 && !nearFloor) mismatches.push({ cell, m, what: `ν=${nu}: map ${v}, direct has no state above the floor (${where})` });
          continue;
        }
        if (Math.abs(d.bindingHartree - floor) <= tolerance * floor * 2) continue;
        statesCompared++;
        const rel = Math.abs(v - d.bindingHartree) / d.bindingHartree;
        if (!(rel <= worstRelError) || worst === null) {
          if (!(rel <= worstRelError)) worstRelError = Number.isNaN(rel) ? Infinity : rel;
          if (worst === null || rel >= worstRelError) worst = { cell, m, nu, alpha, fieldAu: B, map: v, direct: d.bindingHartree };
        }
        if (!(rel <= tolerance)) mismatches.push({ cell, m, what: `ν=${nu}: map ${v} vs direct ${d.bindingHartree}, rel ${rel.toExponential(2)} (${where})` });
      }
    }
  }
  return { worstRelError, worst, statesCompared, mismatches };
}
