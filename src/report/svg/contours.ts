/**
 * Contour lines of a function sampled on a rectangular grid by marching squares (W. E. Lorensen, H. E. Cline,
 * Computer Graphics 21, 163 (1987), in its 2D form): each grid cell contributes the segments where the level
 * crosses its edges, with linear interpolation along the edges; saddle cells are resolved by the cell mean.
 */

/** Segments [x1, y1, x2, y2] in grid coordinates (column index, row index) where f = level. */
export function contourSegments(f: ArrayLike<number>, rows: number, cols: number, level: number): Array<[number, number, number, number]> {
  const out: Array<[number, number, number, number]> = [];
  const at = (r: number, c: number) => f[r * cols + c] - level;
  const cross = (a: number, b: number) => a / (a - b);
  for (let r = 0; r + 1 < rows; r++)
    for (let c = 0; c + 1 < cols; c++) {
      const v = [at(r, c), at(r, c + 1), at(r + 1, c + 1), at(r + 1, c)]; // corners clockwise from top left
      const idx = (v[0] > 0 ? 1 : 0) | (v[1] > 0 ? 2 : 0) | (v[2] > 0 ? 4 : 0) | (v[3] > 0 ? 8 : 0);
      if (idx === 0 || idx === 15) continue;
      // edge points: 0 top, 1 right, 2 bottom, 3 left
      const edge = (e: number): [number, number] => {
        switch (e) {
          case 0:
            return [c + cross(v[0], v[1]), r];
          case 1:
            return [c + 1, r + cross(v[1], v[2])];
          case 2:
            return [c + 1 - cross(v[2], v[3]), r + 1];
          default:
            return [c, r + 1 - cross(v[3], v[0])];
        }
      };
      const seg = (e1: number, e2: number) => {
        const [x1, y1] = edge(e1), [x2, y2] = edge(e2);
        out.push([x1, y1, x2, y2]);
      };
      const centre = (v[0] + v[1] + v[2] + v[3]) / 4 > 0;
      switch (idx) {
        case 1: case 14: seg(3, 0); break;
        case 2: case 13: seg(0, 1); break;
        case 3: case 12: seg(3, 1); break;
        case 4: case 11: seg(1, 2); break;
        case 6: case 9: seg(0, 2); break;
        case 7: case 8: seg(3, 2); break;
        case 5:
          if (centre) { seg(3, 2); seg(0, 1); } else { seg(3, 0); seg(1, 2); }
          break;
        case 10:
          if (centre) { seg(3, 0); seg(1, 2); } else { seg(3, 2); seg(0, 1); }
          break;
      }
    }
  return out;
}
