/**
 * A uniform bucket grid over axis-aligned boxes: which boxes may contain a point, or overlap a
 * box, in time proportional to the answer instead of the number of boxes. Used where a plate
 * with many openings would otherwise make every query look at every piece (the size field,
 * clearance checks between loops).
 *
 * Items whose box covers more than `MAX_CELLS_PER_ITEM` cells (a local size disk spanning the
 * whole plate among many small holes) are kept in a short `large` list that every query visits,
 * so one big item never fills thousands of cells.
 */

/** Cells an item may occupy before it goes to the `large` list. */
const MAX_CELLS_PER_ITEM = 64;
/** Hard cap on the number of cells (memory: two Int32 per cell). */
const MAX_CELLS = 1 << 22;

export interface BoxGrid {
  minX: number;
  minY: number;
  /** cell width and height */
  cw: number;
  ch: number;
  nx: number;
  ny: number;
  /** items of cell c are items[start[c] … start[c + 1] − 1] (CSR) */
  start: Int32Array;
  items: Int32Array;
  /** items visited by every query */
  large: Int32Array;
}

/**
 * Bucket the boxes `[minX, minY, maxX, maxY]` of items 0 … n − 1 (flat, four numbers per item).
 * The cell side is about a quarter of the median box side, but never so small that there are
 * more than about two cells per item over the union of the boxes. Boxes with a non-finite
 * bound are put in the `large` list.
 */
export function buildBoxGrid(boxes: ArrayLike<number>): BoxGrid {
  const n = (boxes.length / 4) | 0;
  let minX = Infinity, minY = Infinity, maxX = -Infinity, maxY = -Infinity;
  const sides: number[] = [];
  for (let i = 0; i < n; i++) {
    const x0 = boxes[4 * i], y0 = boxes[4 * i + 1], x1 = boxes[4 * i + 2], y1 = boxes[4 * i + 3];
    if (!(Number.isFinite(x0) && Number.isFinite(y0) && Number.isFinite(x1) && Number.isFinite(y1))) continue;
    if (x0 < minX) minX = x0;
    if (y0 < minY) minY = y0;
    if (x1 > maxX) maxX = x1;
    if (y1 > maxY) maxY = y1;
    sides.push(Math.max(x1 - x0, y1 - y0));
  }
  if (sides.length === 0) {
    const large = new Int32Array(n);
    for (let i = 0; i < n; i++) large[i] = i;
    return { minX: 0, minY: 0, cw: 1, ch: 1, nx: 0, ny: 0, start: new Int32Array(1), items: new Int32Array(0), large };
  }
  sides.sort((a, b) => a - b);
  const width = maxX - minX, height = maxY - minY;
  const spacing = Math.sqrt((width * height) / (2 * sides.length));
  let cell = Math.max(0.25 * sides[sides.length >> 1], Number.isFinite(spacing) ? spacing : 0);
  if (!(cell > 0)) cell = Math.max(width, height, 1e-300);
  let nx = Math.max(1, Math.ceil(width / cell));
  let ny = Math.max(1, Math.ceil(height / cell));
  while (nx * ny > MAX_CELLS) {
    nx = Math.max(1, nx >> 1);
    ny = Math.max(1, ny >> 1);
  }
  const cw = width / nx || 1;
  const ch = height / ny || 1;
  const col = (x: number): number => Math.min(nx - 1, Math.max(0, Math.floor((x - minX) / cw)));
  const row = (y: number): number => Math.min(ny - 1, Math.max(0, Math.floor((y - minY) / ch)));

  // two passes: count per cell, then fill (CSR)
  const count = new Int32Array(nx * ny + 1);
  const large: number[] = [];
  const range = new Int32Array(4 * n).fill(-1);
  for (let i = 0; i < n; i++) {
    const x0 = boxes[4 * i], y0 = boxes[4 * i + 1], x1 = boxes[4 * i + 2], y1 = boxes[4 * i + 3];
    if (!(Number.isFinite(x0) && Number.isFinite(y0) && Number.isFinite(x1) && Number.isFinite(y1))) {
      large.push(i);
      continue;
    }
    const i0 = col(x0), i1 = col(x1), j0 = row(y0), j1 = row(y1);
    if ((i1 - i0 + 1) * (j1 - j0 + 1) > MAX_CELLS_PER_ITEM) {
      large.push(i);
      continue;
    }
    range[4 * i] = i0; range[4 * i + 1] = i1; range[4 * i + 2] = j0; range[4 * i + 3] = j1;
    for (let a = i0; a <= i1; a++) for (let b = j0; b <= j1; b++) count[a * ny + b + 1]++;
  }
  for (let c = 0; c < nx * ny; c++) count[c + 1] += count[c];
  const items = new Int32Array(count[nx * ny]);
  const fill = count.slice(0, nx * ny);
  for (let i = 0; i < n; i++) {
    if (range[4 * i] < 0) continue;
    for (let a = range[4 * i]; a <= range[4 * i + 1]; a++) {
      for (let b = range[4 * i + 2]; b <= range[4 * i + 3]; b++) items[fill[a * ny + b]++] = i;
    }
  }
  return { minX, minY, cw, ch, nx, ny, start: count, items, large: Int32Array.from(large) };
}

/** The cell holding (x, y), or −1 when the point lies outside every bucketed box. */
export function gridCell(grid: BoxGrid, x: number, y: number): number {
  const fx = (x - grid.minX) / grid.cw;
  const fy = (y - grid.minY) / grid.ch;
  if (!(fx >= 0 && fy >= 0 && fx <= grid.nx && fy <= grid.ny)) return -1;
  const i = Math.min(grid.nx - 1, Math.floor(fx));
  const j = Math.min(grid.ny - 1, Math.floor(fy));
  return i * grid.ny + j;
}

/**
 * Calls `visit(i)` once for every item whose box may overlap the query box grown by `pad`
 * (the `large` items always; the others when they share a cell with it). The caller tests the
 * actual overlap.
 */
export function forEachNearBox(
  grid: BoxGrid, x0: number, y0: number, x1: number, y1: number, pad: number, seen: Uint8Array, visit: (i: number) => void,
): void {
  for (let k = 0; k < grid.large.length; k++) visit(grid.large[k]);
  if (grid.nx === 0) return;
  const fx0 = Math.floor((x0 - pad - grid.minX) / grid.cw), fx1 = Math.floor((x1 + pad - grid.minX) / grid.cw);
  const fy0 = Math.floor((y0 - pad - grid.minY) / grid.ch), fy1 = Math.floor((y1 + pad - grid.minY) / grid.ch);
  if (fx1 < 0 || fy1 < 0 || fx0 >= grid.nx || fy0 >= grid.ny) return;
  const i0 = Math.max(0, fx0), i1 = Math.min(grid.nx - 1, fx1);
  const j0 = Math.max(0, fy0), j1 = Math.min(grid.ny - 1, fy1);
  const touched: number[] = [];
  for (let a = i0; a <= i1; a++) {
    for (let b = j0; b <= j1; b++) {
      const c = a * grid.ny + b;
      for (let k = grid.start[c]; k < grid.start[c + 1]; k++) {
        const item = grid.items[k];
        if (seen[item]) continue;
        seen[item] = 1;
        touched.push(item);
        visit(item);
      }
    }
  }
  for (const item of touched) seen[item] = 0;
}
