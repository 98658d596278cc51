import { describe, it, expect } from 'vitest';
import { orderNestedDissection } from '../../src/linalg/index.js';
import { gridKronecker } from './helpers.js';

/** Connected components of the nx × ny five-point grid without the given nodes. */
function componentSizes(nx: number, ny: number, removed: Set<number>): number[] {
  const seen = new Uint8Array(nx * ny);
  const sizes: number[] = [];
  for (let s = 0; s < nx * ny; s++) {
    if (seen[s] || removed.has(s)) continue;
    let size = 0;
    const stack = [s];
    seen[s] = 1;
    while (stack.length > 0) {
      const v = stack.pop()!;
      size++;
      const ix = v % nx, iy = (v - ix) / nx;
      for (const [dx, dy] of [[1, 0], [-1, 0], [0, 1], [0, -1]]) {
        const jx = ix + dx, jy = iy + dy;
        if (jx < 0 || jy < 0 || jx >= nx || jy >= ny) continue;
        const u = jy * nx + jx;
        if (!seen[u] && !removed.has(u)) { seen[u] = 1; stack.push(u); }
      }
    }
    sizes.push(size);
  }
  return sizes.sort((a, b) => a - b);
}

describe('nested dissection separators', () => {
  // A 41 × 20 five-point grid: a vertex set splitting it into two big parts needs at least
  // min(41, 20) = 20 nodes (every one of the 20 grid rows must be cut; from memory, the grid
  // separator bound George 1973 builds on). The median of the 820 nodes falls in the middle of
  // column x = 20: a cut that scatters the tied nodes of that column over both halves, or a
  // one-sided boundary layer of a poor cut, is thicker; the minimum vertex cover of the cut
  // edges has exactly 20 nodes (column 20, or the staircase 19|20).
  it('top separator of a grid has the minimum 20 nodes and splits it in halves', () => {
    const nx = 41, ny = 20;
    const { A, rowXY } = gridKronecker(nx, ny);
    const ord = orderNestedDissection(A, rowXY, { leafSize: 16 });
    const nodeOfRow = (r: number) => rowXY[2 * r + 1] * nx + rowXY[2 * r];
    // the top separator's nodes form the chain at the root of the elimination tree: last rows
    const top = new Set(Array.from(ord.perm.subarray(A.n - 2 * ny), nodeOfRow));
    expect(top.size).toBe(ny);
    const parts = componentSizes(nx, ny, top);
    expect(parts.length).toBe(2);
    // 820 − 20 = 800 nodes left; the cut is taken within 45–55 % of the nodes, so the smaller
    // part has at least 0.45·820 − 20 = 349 nodes
    expect(parts[0] + parts[1]).toBe(800);
    expect(parts[0]).toBeGreaterThanOrEqual(349);
    // one node fewer does not separate (the bound above)
    const fewer = new Set(Array.from(ord.perm.subarray(A.n - 2 * ny + 2), nodeOfRow));
    expect(componentSizes(nx, ny, fewer).length).toBe(1);
  });
});
