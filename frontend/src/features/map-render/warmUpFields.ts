import type { MapFields } from './mapGeometry';

/**
 * Synthetic fields shaped like a real map's (nested regions of 0…3 surviving states with curved boundaries, and a
 * binding energy spanning several decades), for warming up the contour code: run a few times on them, the JIT has
 * optimised it before the first real picture needs it. `kind` picks the survivors (counts) or one orbital (classes).
 */
export function warmUpFields(side: number, kind: MapFields['shownKind']): MapFields {
  const n = side * side;
  const region = new Float64Array(n);
  const energy = new Float64Array(n);
  for (let j = 0; j < side; j++) {
    for (let i = 0; i < side; i++) {
      const x = i / (side - 1);
      const y = j / (side - 1);
      // Binding grows towards large α and strong field; nothing bound in the lower-left corner.
      const e = 10 ** (-9 + 6 * (0.6 * x + 0.4 * y)) * (x + y > 0.35 ? 1 : 0);
      energy[j * side + i] = e;
      const level = e > 0 ? Math.min(3, Math.floor(4 * (x * x + y) * (1 + 0.1 * Math.sin(9 * x)))) : 0;
      region[j * side + i] = kind === 'survivors' ? level : Math.min(2, level);
    }
  }
  // 1 µK … 1 K in hartree (1 K = 3.1668e-6 hartree), as contour levels.
  const levelsKelvin = [1e-6, 1e-4, 1e-2, 1];
  return { nx: side, ny: side, shownKind: kind, region, energy, levelsKelvin, levelsHartree: levelsKelvin.map((k) => k * 3.166811563e-6) };
}
