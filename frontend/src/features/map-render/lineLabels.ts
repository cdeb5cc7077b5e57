/** A label placed on a line: its centre and the angle (degrees) of the line there, kept upright. */
export interface LineLabel {
  x: number;
  y: number;
  angle: number;
}

type Point = [number, number];

function polylineLength(line: readonly Point[]): number {
  let s = 0;
  for (let k = 1; k < line.length; k++) s += Math.hypot(line[k][0] - line[k - 1][0], line[k][1] - line[k - 1][1]);
  return s;
}

/**
 * Where to put a value label on each screen-space line long enough to carry one: at half its length, rotated
 * along the line and never upside down. Lines shorter than `minLength` pixels get no label; at most `maxLabels`
 * labels, the longest lines first.
 */
export function placeLineLabels(lines: readonly (readonly Point[])[], minLength = 90, maxLabels = 3): LineLabel[] {
  const measured = lines.map((line) => ({ line, length: polylineLength(line) })).filter((l) => l.length >= minLength);
  measured.sort((a, b) => b.length - a.length);
  return measured.slice(0, maxLabels).map(({ line, length }) => {
    const half = length / 2;
    let s = 0;
    for (let k = 1; k < line.length; k++) {
      const [ax, ay] = line[k - 1];
      const [bx, by] = line[k];
      const seg = Math.hypot(bx - ax, by - ay);
      if (s + seg >= half && seg > 0) {
        const t = (half - s) / seg;
        let angle = (Math.atan2(by - ay, bx - ax) * 180) / Math.PI;
        if (angle > 90) angle -= 180;
        if (angle < -90) angle += 180;
        return { x: ax + t * (bx - ax), y: ay + t * (by - ay), angle };
      }
      s += seg;
    }
    const last = line[line.length - 1];
    return { x: last[0], y: last[1], angle: 0 };
  });
}
