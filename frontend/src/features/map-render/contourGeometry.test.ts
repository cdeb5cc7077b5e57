import { describe, expect, it } from 'vitest';
import { clipLine, filledContours, isoLinesOf, logIsoLines, stepContours } from './contourGeometry';

// A 4 × 4 field read row by row (row j = 0 first). The left two columns are unbound (0), the right two bound (2).
// Node i sits at contour coordinate i + ½, so the boundary lies halfway between columns 1 and 2: x = 2.
const LEFT_UNBOUND_RIGHT_BOUND = [
  0, 0, 2, 2,
  0, 0, 2, 2,
  0, 0, 2, 2,
  0, 0, 2, 2,
];

describe('stepContours', () => {
  it('puts the bound/unbound boundary of a 4 × 4 grid halfway between columns 1 and 2', () => {
    const [bound] = stepContours(LEFT_UNBOUND_RIGHT_BOUND, 4, 4, [1.5]);
    const xs = bound.geometry.coordinates[0][0].map((p) => p[0]);
    expect(Math.min(...xs)).toBe(2);
    expect(Math.max(...xs)).toBe(4);
  });
  it('gives "resonance or better" (≥ ½) and "bound" (≥ 1½) the same boundary on a direct bound/unbound step', () => {
    const [atLeastResonance, bound] = stepContours(LEFT_UNBOUND_RIGHT_BOUND, 4, 4, [0.5, 1.5]);
    expect(atLeastResonance.geometry).toEqual(bound.geometry);
  });
  it('returns nothing above the largest value (no bound cells → empty region)', () => {
    const [none] = stepContours(new Array(16).fill(0), 4, 4, [1.5]);
    expect(none.geometry.coordinates).toEqual([]);
  });
  it('reports bands in ascending threshold order whatever the order asked', () => {
    const bands = stepContours(LEFT_UNBOUND_RIGHT_BOUND, 4, 4, [1.5, 0.5]);
    expect(bands.map((b) => b.threshold)).toEqual([0.5, 1.5]);
  });
});

/** x where the region's boundary crosses the horizontal line y (the left-most crossing of any ring edge). */
function crossingAt(geometry: { coordinates: number[][][][] }, y: number): number {
  let best = Infinity;
  for (const polygon of geometry.coordinates) {
    for (const ring of polygon) {
      for (let k = 0; k + 1 < ring.length; k++) {
        const [x0, y0] = ring[k];
        const [x1, y1] = ring[k + 1];
        if ((y0 - y) * (y1 - y) <= 0 && y0 !== y1) best = Math.min(best, x0 + ((y - y0) / (y1 - y0)) * (x1 - x0));
      }
    }
  }
  return best;
}

describe('stepContours smoothing', () => {
  // A boundary at a shallow angle: row j is bound from column 6 + ⌊j / 4⌋ on (a staircase of 1-cell steps every 4 rows).
  const nx = 16;
  const ny = 16;
  const stairs = Array.from({ length: nx * ny }, (_, c) => (c % nx >= 6 + Math.floor(Math.floor(c / nx) / 4) ? 2 : 0));

  it('keeps every node on its side: each row crosses between its last unbound and first bound column', () => {
    const [bound] = stepContours(stairs, nx, ny, [1]);
    for (let j = 0; j < ny; j++) {
      const x = crossingAt(bound.geometry, j + 0.5);
      const first = 6 + Math.floor(j / 4); // first bound node, at first + ½
      expect(x).toBeGreaterThan(first - 0.5);
      expect(x).toBeLessThan(first + 0.5);
    }
  });

  it('draws the staircase as a slope: the crossing moves by under 0.6 cell from row to row (unsmoothed it jumps by a whole cell)', () => {
    const [bound] = stepContours(stairs, nx, ny, [1]);
    const xs = Array.from({ length: ny }, (_, j) => crossingAt(bound.geometry, j + 0.5));
    for (let j = 1; j < ny; j++) {
      expect(xs[j]).toBeGreaterThanOrEqual(xs[j - 1] - 1e-9);
      expect(xs[j] - xs[j - 1]).toBeLessThan(0.6);
    }
  });

  it('keeps nested regions nested: "resonance or better" contains "bound" on a field with a resonance band', () => {
    // Unbound left, a one-column resonance band (1) on a slant, bound right.
    const field = Array.from({ length: nx * ny }, (_, c) => {
      const i = c % nx;
      const edge = 6 + Math.floor(Math.floor(c / nx) / 3);
      return i < edge ? 0 : i === edge ? 1 : 2;
    });
    const [atLeastResonance, bound] = stepContours(field, nx, ny, [0.5, 1.5]);
    for (let j = 0; j < ny; j++) expect(crossingAt(atLeastResonance.geometry, j + 0.5)).toBeLessThan(crossingAt(bound.geometry, j + 0.5));
  });
});

describe('filledContours', () => {
  it('interpolates linearly: the level 1.5 between nodes of 0 (x = 1½) and 2 (x = 2½) lies at x = 2¼', () => {
    const [band] = filledContours(LEFT_UNBOUND_RIGHT_BOUND, 4, 4, [1.5]);
    const xs = band.geometry.coordinates[0][0].map((p) => p[0]);
    expect(Math.min(...xs)).toBe(2.25);
  });
});

describe('isoLinesOf', () => {
  it('keeps only the vertical boundary x = 2 of a left/right split, dropping the edges along the grid border', () => {
    const [bound] = stepContours(LEFT_UNBOUND_RIGHT_BOUND, 4, 4, [1]);
    const lines = isoLinesOf(bound.geometry, 4, 4);
    expect(lines).toHaveLength(1);
    const line = lines[0];
    expect(line.every(([x]) => x === 2)).toBe(true);
    // From the first node row (y = ½) to the last (y = 3½): the nodes' extent, where the map is drawn.
    const ys = line.map(([, y]) => y).sort((a, b) => a - b);
    expect(ys[0]).toBe(0.5);
    expect(ys[ys.length - 1]).toBe(3.5);
  });
  it('returns a closed loop around an isolated bound island unchanged', () => {
    // 5 × 5 field with one bound node in the middle: its iso-line never touches the border.
    const island = new Array(25).fill(0);
    island[12] = 2;
    const [bound] = stepContours(island, 5, 5, [1]);
    const lines = isoLinesOf(bound.geometry, 5, 5);
    expect(lines).toHaveLength(1);
    expect(lines[0][0]).toEqual(lines[0][lines[0].length - 1]);
    // The island stays (the bound node keeps its class), centred on the node at 2.5 and inside its cell.
    const xs = lines[0].map(([x]) => x);
    expect((Math.min(...xs) + Math.max(...xs)) / 2).toBeCloseTo(2.5, 12);
    expect(Math.min(...xs)).toBeGreaterThan(2);
    expect(Math.max(...xs)).toBeLessThan(3);
    expect(Math.max(...xs) - Math.min(...xs)).toBeGreaterThan(0.3);
  });
});

describe('clipLine', () => {
  it('cuts a line crossing the rectangle [0, 1]² into the part inside', () => {
    expect(clipLine([[-1, 0.5], [2, 0.5]], 0, 0, 1, 1)).toEqual([[[0, 0.5], [1, 0.5]]]);
  });
  it('splits a line that leaves and re-enters into two pieces', () => {
    const pieces = clipLine([[0.2, 0.5], [0.2, 2], [0.8, 2], [0.8, 0.5]], 0, 0, 1, 1);
    expect(pieces).toEqual([[[0.2, 0.5], [0.2, 1]], [[0.8, 1], [0.8, 0.5]]]);
  });
});

describe('logIsoLines', () => {
  it('places the 10⁻⁸ line a third of the way between cells of 10⁻⁹ and 10⁻⁶ (interpolation in log₁₀)', () => {
    // Columns: 1e-9, 1e-6, 1e-6 on every row of a 3 × 2 grid.
    const v = [1e-9, 1e-6, 1e-6, 1e-9, 1e-6, 1e-6];
    const [{ level, lines }] = logIsoLines(v, 3, 2, [1e-8]);
    expect(level).toBe(1e-8);
    expect(lines).toHaveLength(1);
    // Node 0 at x = 0.5, node 1 at x = 1.5; log goes −9 → −6; −8 lies at one third: x = 0.5 + 1/3.
    for (const [x] of lines[0]) expect(x).toBeCloseTo(0.5 + 1 / 3, 12);
  });
  it('treats zero (nothing bound) as absent and draws the level line hugging the bound side', () => {
    const v = [0, 1e-3, 0, 1e-3];
    const [{ lines }] = logIsoLines(v, 2, 2, [1e-6]);
    expect(lines).toHaveLength(1);
    for (const [x] of lines[0]) {
      expect(x).toBeGreaterThan(1.49);
      expect(x).toBeLessThan(1.5);
    }
  });
  it('returns levels sorted ascending and skips non-positive levels', () => {
    const v = [1e-9, 1e-3, 1e-9, 1e-3];
    expect(logIsoLines(v, 2, 2, [1e-4, -1, 1e-6]).map((r) => r.level)).toEqual([1e-6, 1e-4]);
  });
});
