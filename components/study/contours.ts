/**
 * Marching squares on a grid of values (rows j, columns i; null = no value): the line segments where the
 * field crosses `level`, in fractional grid coordinates (i, j), interpolated linearly along cell edges.
 * Saddle cells are split by the cell's mean. Pure.
 */
export type Segment = [[number, number], [number, number]];

export function contourSegments(field: (number | null)[][], level: number): Segment[] {
  const out: Segment[] = [];
  for (let j = 0; j + 1 < field.length; j++)
    for (let i = 0; i + 1 < field[j].length; i++) {
      const a = field[j][i];
      const b = field[j][i + 1];
      const c = field[j + 1][i + 1];
      const d = field[j + 1][i];
      if (a === null || b === null || c === null || d === null) continue;
      // Corners counter-clockwise from (i, j): a, b, c, d; edges a-b, b-c, c-d, d-a.
      const lerp = (p: [number, number], q: [number, number], vp: number, vq: number): [number, number] => {
        const t = vq === vp ? 0.5 : (level - vp) / (vq - vp);
        return [p[0] + t * (q[0] - p[0]), p[1] + t * (q[1] - p[1])];
      };
      const P: [number, number][] = [
        [i, j],
        [i + 1, j],
        [i + 1, j + 1],
        [i, j + 1],
      ];
      const V = [a, b, c, d];
      const cross: [number, number][] = [];
      for (let k = 0; k < 4; k++) {
        const vp = V[k];
        const vq = V[(k + 1) % 4];
        if (vp >= level !== vq >= level) cross.push(lerp(P[k], P[(k + 1) % 4], vp, vq));
      }
      if (cross.length === 2) out.push([cross[0], cross[1]]);
      else if (cross.length === 4) {
        // Saddle: pair the crossings so the higher corners stay joined when the centre is high.
        const high = (a + b + c + d) / 4 >= level;
        if (high === a >= level) out.push([cross[0], cross[3]], [cross[1], cross[2]]);
        else out.push([cross[0], cross[1]], [cross[2], cross[3]]);
      }
    }
  return out;
}
