/**
 * Contour lines of nodal values on a rectilinear (uniform or stretched)
 * grid by marching squares, the 2-D form of marching cubes (Lorensen &
 * Cline 1987). Internal: `fieldMap` draws them.
 *
 * Each grid cell has four corner values; a corner is "above" when its
 * value is ≥ the level. The 16 above/below patterns give 0, 1 or 2 line
 * segments, whose ends lie on the cell edges that change side, placed by
 * linear interpolation along the edge: t = (level − v₀)/(v₁ − v₀). Along a
 * cell edge the interpolated line is exact for a field linear on that edge;
 * for a smooth field the point's value misses the level by at most
 * h²·max|u''|/8, h the edge length (the linear-interpolation error).
 *
 * Saddle cells (two diagonally opposite corners above, the other two
 * below) are ambiguous. They are resolved by the cell-centre mean
 * m = (v₀₀ + v₁₀ + v₁₁ + v₀₁)/4: if m ≥ level the centre is above and the
 * two above corners are joined through it (the segments cut off the two
 * below corners); otherwise the below corners are joined (the segments cut
 * off the above ones). Cells with a NaN corner draw nothing.
 *
 * Segments are joined into polylines through their shared edge crossings
 * (the crossing of an edge is computed once, so both neighbouring cells use
 * the very same point); a polyline that returns to its start is closed.
 *
 * Source: Lorensen, W. E., & Cline, H. E. (1987). Marching cubes: a high
 * resolution 3D surface construction algorithm. Computer Graphics 21(4),
 * 163–169 (the 2-D case table follows from the same construction).
 *
 * @module
 */

/** A contour polyline in data coordinates. */
export interface ContourLine {
  /** x₀, y₀, x₁, y₁, … of the points in order. */
  readonly points: Float64Array;
  /** Whether the line returns to its first point (the repeated point is not stored). */
  readonly closed: boolean;
}

// edges of cell (i, j): 0 bottom (y = y_j), 1 right (x = x_{i+1}), 2 top (y = y_{j+1}), 3 left (x = x_i)
const CASES: readonly (readonly number[])[] = [
  [], [0, 3], [0, 1], [3, 1], [1, 2], [], [0, 2], [2, 3],
  [2, 3], [0, 2], [], [1, 2], [1, 3], [0, 1], [0, 3], [],
];

/**
 * The contour lines u = level of nodal values v on the nodes xs × ys
 * (v[i·ny + j] at (xs[i], ys[j]), x slowest).
 */
export function contourLines(xs: Float64Array, ys: Float64Array, v: Float64Array, level: number): ContourLine[] {
  const nx = xs.length;
  const ny = ys.length;
  const point = new Map<number, number>(); // edge key → index into px/py
  const pxs: number[] = [];
  const pys: number[] = [];
  // edge keys: 2·(i·ny + j) for the x-directed edge from node (i, j), +1 for the y-directed one
  const cross = (key: number): number => {
    const found = point.get(key);
    if (found !== undefined) return found;
    const node = key >> 1;
    const i = Math.floor(node / ny);
    const j = node - i * ny;
    const v0 = v[node];
    let x: number;
    let y: number;
    if ((key & 1) === 0) {
      const t = (level - v0) / (v[node + ny] - v0);
      x = xs[i] + t * (xs[i + 1] - xs[i]);
      y = ys[j];
    } else {
      const t = (level - v0) / (v[node + 1] - v0);
      x = xs[i];
      y = ys[j] + t * (ys[j + 1] - ys[j]);
    }
    pxs.push(x);
    pys.push(y);
    point.set(key, pxs.length - 1);
    return pxs.length - 1;
  };
  const segA: number[] = [];
  const segB: number[] = [];
  for (let i = 0; i + 1 < nx; i++) {
    for (let j = 0; j + 1 < ny; j++) {
      const n00 = i * ny + j;
      const a = v[n00];
      const b = v[n00 + ny];
      const c = v[n00 + ny + 1];
      const d = v[n00 + 1];
      if (Number.isNaN(a + b + c + d)) continue;
      const code = (a >= level ? 1 : 0) | (b >= level ? 2 : 0) | (c >= level ? 4 : 0) | (d >= level ? 8 : 0);
      if (code === 0 || code === 15) continue;
      const edge = [2 * n00, 2 * (n00 + ny) + 1, 2 * (n00 + 1), 2 * n00 + 1];
      let pairs: readonly number[];
      if (code === 5 || code === 10) {
        const centreAbove = (a + b + c + d) / 4 >= level;
        // 5: a, c above. Joined through an above centre → cut off b and d; else cut off a and c.
        const cutBD = code === 5 ? centreAbove : !centreAbove;
        pairs = cutBD ? [0, 1, 2, 3] : [0, 3, 1, 2];
      } else {
        pairs = CASES[code];
      }
      for (let k = 0; k < pairs.length; k += 2) {
        segA.push(edge[pairs[k]]);
        segB.push(edge[pairs[k + 1]]);
      }
    }
  }
  // join segments through shared edges: every edge crossing belongs to at most two segments
  const at = new Map<number, number[]>();
  for (let s = 0; s < segA.length; s++) {
    for (const key of [segA[s], segB[s]]) {
      const list = at.get(key);
      if (list === undefined) at.set(key, [s]);
      else list.push(s);
    }
  }
  const used = new Uint8Array(segA.length);
  const next = (key: number): number => {
    for (const s of at.get(key) ?? []) if (used[s] === 0) return s;
    return -1;
  };
  const lines: ContourLine[] = [];
  for (let s0 = 0; s0 < segA.length; s0++) {
    if (used[s0] === 1) continue;
    used[s0] = 1;
    const chain = [segA[s0], segB[s0]];
    let closed = false;
    for (let s = next(chain[chain.length - 1]); s >= 0; s = next(chain[chain.length - 1])) {
      used[s] = 1;
      const tail = chain[chain.length - 1];
      const other = segA[s] === tail ? segB[s] : segA[s];
      if (other === chain[0]) {
        closed = true;
        break;
      }
      chain.push(other);
    }
    if (!closed) {
      for (let s = next(chain[0]); s >= 0; s = next(chain[0])) {
        used[s] = 1;
        const head = chain[0];
        chain.unshift(segA[s] === head ? segB[s] : segA[s]);
      }
    }
    const pts = new Float64Array(2 * chain.length);
    chain.forEach((key, k) => {
      const p = cross(key);
      pts[2 * k] = pxs[p];
      pts[2 * k + 1] = pys[p];
    });
    lines.push({ points: pts, closed });
  }
  return lines;
}
