/**
 * Synthetic inputs for the report tests: a structured triangle mesh (rectangle or L-shape,
 * CST or LST) built straight into typed arrays, its plate geometry, a model, and a study
 * result with one converging, one singular and one undecided site. The scenario (a bracket
 * web with a notch in a pump skid) is our own invention.
 */
import type { PlateGeometry, BoundaryPiece } from '../../src/geometry/types.js';
import type { Mesh } from '../../src/mesh/types.js';
import type { Model, Point } from '../../src/model/types.js';
import type { SiteResult, StudyResult } from '../../src/study/types.js';
import type { ReportInput } from '../../src/report/index.js';

export interface GridOptions {
  nx: number;
  ny: number;
  width: number;
  height: number;
  order: 1 | 2;
  /** remove the top-right quarter (an L-shaped plate with a 270° re-entrant corner) */
  lShape?: boolean;
}

/** Outline corners (counter-clockwise) of the rectangle or the L-shape. */
export function outlineCorners(o: GridOptions): Point[] {
  const W = o.width, H = o.height;
  return o.lShape
    ? [[0, 0], [W, 0], [W, H / 2], [W / 2, H / 2], [W / 2, H], [0, H]]
    : [[0, 0], [W, 0], [W, H], [0, H]];
}

export function plateGeometry(o: GridOptions): PlateGeometry {
  const pts = outlineCorners(o);
  const pieces: BoundaryPiece[] = pts.map((p, i) => ({
    id: i,
    curve: { kind: 'line', from: p, to: pts[(i + 1) % pts.length] },
    loop: 'outline',
    role: 'edge',
    radius: 0,
    keyPath: `plate.outline[${i}]`,
  }));
  const W = o.width, H = o.height;
  return {
    pieces,
    loops: [{ id: 'outline', hole: false, pieces: pieces.map((p) => p.id), keyPath: 'plate.outline' }],
    corners: o.lShape
      ? [{ at: [W / 2, H / 2], interiorAngleDeg: 270, loop: 'outline', pieceIn: 2, pieceOut: 3, keyPath: 'plate.outline[3]' }]
      : [],
    area: o.lShape ? 0.75 * W * H : W * H,
    bbox: { minX: 0, minY: 0, maxX: W, maxY: H },
    scale: Math.hypot(W, H),
  };
}

/** Which outline piece a boundary point lies on (closest line). */
function pieceOf(x: number, y: number, pts: Point[]): number {
  let best = 0, bestD = Infinity;
  pts.forEach((p, i) => {
    const q = pts[(i + 1) % pts.length];
    const dx = q[0] - p[0], dy = q[1] - p[1];
    const t = Math.max(0, Math.min(1, ((x - p[0]) * dx + (y - p[1]) * dy) / (dx * dx + dy * dy)));
    const d = Math.hypot(x - p[0] - t * dx, y - p[1] - t * dy);
    if (d < bestD) {
      bestD = d;
      best = i;
    }
  });
  return best;
}

/**
 * Structured mesh: each grid cell split along its rising diagonal into two counter-clockwise
 * triangles. Edges are indexed structurally (horizontal, vertical, diagonal) so that LST
 * mid-nodes and boundary edges come without hash maps, fast enough for 500 000 nodes.
 */
export function gridMesh(o: GridOptions): Mesh {
  const { nx, ny } = o;
  const keep = (i: number, j: number) => !(o.lShape && i >= nx / 2 && j >= ny / 2);
  const nH = nx * (ny + 1), nV = (nx + 1) * ny, nD = nx * ny;
  const H = (i: number, j: number) => j * nx + i;
  const V = (i: number, j: number) => nH + j * (nx + 1) + i;
  const D = (i: number, j: number) => nH + nV + j * nx + i;
  const g = (i: number, j: number) => j * (nx + 1) + i;
  const vertexId = new Int32Array((nx + 1) * (ny + 1)).fill(-1);
  const edgeUses = new Uint8Array(nH + nV + nD);
  let nCells = 0;
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      if (!keep(i, j)) continue;
      nCells++;
      for (const v of [g(i, j), g(i + 1, j), g(i, j + 1), g(i + 1, j + 1)]) vertexId[v] = 0;
      edgeUses[H(i, j)]++; edgeUses[V(i + 1, j)]++; edgeUses[D(i, j)] += 2;
      edgeUses[H(i, j + 1)]++; edgeUses[V(i, j)]++;
    }
  }
  let nVertices = 0;
  for (let v = 0; v < vertexId.length; v++) if (vertexId[v] === 0) vertexId[v] = nVertices++;
  const midId = new Int32Array(edgeUses.length).fill(-1);
  let nNodes = nVertices;
  if (o.order === 2) for (let e = 0; e < edgeUses.length; e++) if (edgeUses[e] > 0) midId[e] = nNodes++;
  const xy = new Float64Array(2 * nNodes);
  const dx = o.width / nx, dy = o.height / ny;
  for (let j = 0; j <= ny; j++) {
    for (let i = 0; i <= nx; i++) {
      const id = vertexId[g(i, j)];
      if (id < 0) continue;
      xy[2 * id] = i * dx;
      xy[2 * id + 1] = j * dy;
    }
  }
  const npe = o.order === 2 ? 6 : 3;
  const elemNodes = new Uint32Array(2 * nCells * npe);
  const stride = o.order === 2 ? 3 : 2;
  const bEdges: number[] = [], bPiece: number[] = [], bElem: number[] = [];
  const pts = outlineCorners(o);
  let e = 0;
  const addElem = (corners: number[], edges: number[]) => {
    const base = npe * e;
    for (let k = 0; k < 3; k++) elemNodes[base + k] = corners[k];
    if (npe === 6) for (let k = 0; k < 3; k++) elemNodes[base + 3 + k] = midId[edges[k]];
    for (let k = 0; k < 3; k++) {
      if (edgeUses[edges[k]] !== 1) continue;
      const a = corners[k], b = corners[(k + 1) % 3];
      bEdges.push(a, b);
      if (stride === 3) bEdges.push(midId[edges[k]]);
      bPiece.push(pieceOf(0.5 * (xy[2 * a] + xy[2 * b]), 0.5 * (xy[2 * a + 1] + xy[2 * b + 1]), pts));
      bElem.push(e);
    }
    e++;
  };
  for (let j = 0; j < ny; j++) {
    for (let i = 0; i < nx; i++) {
      if (!keep(i, j)) continue;
      const p00 = vertexId[g(i, j)], p10 = vertexId[g(i + 1, j)], p01 = vertexId[g(i, j + 1)], p11 = vertexId[g(i + 1, j + 1)];
      addElem([p00, p10, p11], [H(i, j), V(i + 1, j), D(i, j)]);
      addElem([p00, p11, p01], [D(i, j), H(i, j + 1), V(i, j)]);
    }
  }
  if (o.order === 2) {
    for (let k = 0; k < elemNodes.length; k += 6) {
      for (const [m, a, b] of [[3, 0, 1], [4, 1, 2], [5, 2, 0]] as const) {
        const mid = elemNodes[k + m], na = elemNodes[k + a], nb = elemNodes[k + b];
        xy[2 * mid] = 0.5 * (xy[2 * na] + xy[2 * nb]);
        xy[2 * mid + 1] = 0.5 * (xy[2 * na + 1] + xy[2 * nb + 1]);
      }
    }
  }
  return {
    xy,
    elemNodes,
    nodesPerElem: npe,
    order: o.order,
    boundaryEdges: Uint32Array.from(bEdges),
    edgeStride: stride,
    boundaryPiece: Int32Array.from(bPiece),
    boundaryElem: Int32Array.from(bElem),
    nVertices,
  };
}

/** A field that rises towards a point like r^−q (capped close to it), on top of a gentle gradient. */
export function cornerField(mesh: Mesh, at: Point, q: number, size: number): Float64Array {
  const n = mesh.xy.length / 2;
  const v = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const x = mesh.xy[2 * i], y = mesh.xy[2 * i + 1];
    const r = Math.max(Math.hypot(x - at[0], y - at[1]), 0.004 * size);
    v[i] = 40 + 25 * (x / size) + 60 * (r / size) ** -q;
  }
  return v;
}

/** A smooth displacement field: bending-like sag plus stretch. */
export function smoothDisplacement(mesh: Mesh, size: number): Float64Array {
  const n = mesh.xy.length / 2;
  const u = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) {
    const x = mesh.xy[2 * i] / size, y = mesh.xy[2 * i + 1] / size;
    u[2 * i] = 0.002 * size * x * (1 - 0.3 * y);
    u[2 * i + 1] = -0.003 * size * x * x;
  }
  return u;
}

export const HOSTILE = `<script>alert(1)</script>"'&=HYPERLINK("x")\u001b[31m\u0007\u202e`;

export function demoModel(strings: string = ''): Model {
  const s = (base: string) => (strings ? `${base} ${strings}` : base);
  return {
    title: s('Skid bracket web with a re-entrant notch'),
    file: s('models/skid-bracket.yaml'),
    units: { length: s('mm'), force: s('N') },
    params: { w: 400 },
    material: { E: 206000, nu: 0.3 },
    thickness: 12,
    state: 'plane-stress',
    plate: {
      outline: { kind: 'polygon', vertices: outlineCorners({ nx: 1, ny: 1, width: 400, height: 300, order: 1, lShape: true }).map((at) => ({ at, round: 0 })) },
      openings: [
        { id: s('vent'), shape: { kind: 'circle', center: [100, 100], radius: 20 }, keyPath: 'plate.openings[0]' },
      ],
    },
    supports: [{ where: { kind: 'x', value: 0 }, fix: { x: true, y: true }, keyPath: 'supports[0]' }],
    loads: [
      { kind: 'traction', where: { kind: 'x', value: 400 }, traction: [0, -20], keyPath: 'loads[0]' },
      { kind: 'force', where: { kind: 'point', at: [400, 75] }, force: [0, -1500], keyPath: 'loads[1]' },
      { kind: 'pressure', where: { kind: 'opening', id: s('vent') }, pressure: 2, keyPath: 'loads[2]' },
    ],
    mesh: { size: 10, order: 2, local: [] },
    study: { measure: 'von-mises', levels: 5, ratio: 2, sites: 'auto', readouts: { distance: 0.5 } },
    sourceMap: {},
  };
}

/** Levels from exact laws so that tests can compare fitted lines with the data. */
export function singularLevels(q: number, h0: number, n: number, c = 150): SiteResult['levels'] {
  return Array.from({ length: n }, (_, k) => {
    const h = h0 / 2 ** k;
    return { h, dofs: Math.round(4000 * 1.7 ** k), peak: c * h ** -q, peakAt: [200, 150] as Point, atDistance: 118 + k * 0.01 };
  });
}

export function convergingLevels(value: number, p: number, h0: number, n: number): SiteResult['levels'] {
  return Array.from({ length: n }, (_, k) => {
    const h = h0 / 2 ** k;
    return { h, dofs: Math.round(4000 * 1.7 ** k), peak: value - 0.8 * h ** p, peakAt: [100, 120] as Point };
  });
}

export function demoStudy(strings: string = ''): StudyResult {
  const s = (base: string) => (strings ? `${base} ${strings}` : base);
  const sites: SiteResult[] = [
    {
      id: s('S1'),
      at: [200, 150],
      feature: { kind: 'corner', interiorAngleDeg: 270, radius: 0, faces: 'free-free', description: s('re-entrant corner of the outline, 270°') },
      levels: singularLevels(0.4555, 8, 5),
      verdict: 'singular',
      reason: s('peak grows like h^-0.46, matching the free–free 270° wedge (Williams 1952)'),
      estimate: { value: NaN, uncertainty: NaN, observedOrder: NaN },
      growth: { exponent: 0.4562, exponentUncertainty: 0.01, theory: 0.4555 },
      readouts: { atDistance: 118.04, distance: 0.5, average: 131.2, nsif: 812.5, nsifUnits: s('MPa·mm^0.46') },
    },
    {
      id: s('S2'),
      at: [100, 120],
      feature: { kind: 'opening', interiorAngleDeg: 0, radius: 20, description: s('edge of opening vent, radius 20') },
      levels: convergingLevels(182.4, 1.9, 8, 5),
      verdict: 'converging',
      reason: s('successive peaks differ by less than 0.3 % and the observed order is 1.9'),
      estimate: { value: 182.4, uncertainty: 0.9, observedOrder: 1.9 },
      growth: { exponent: 0.01, exponentUncertainty: 0.01, theory: 0 },
      readouts: {},
    },
    {
      id: s('S3'),
      at: [400, 75],
      feature: { kind: 'point-load', interiorAngleDeg: 180, radius: 0, description: s('concentrated force on the right edge') },
      levels: singularLevels(0.7, 8, 3, 90),
      verdict: 'undecided',
      reason: s('only three levels; the growth rate is still changing'),
      advice: s('add two refinement levels or spread the force over a short edge'),
      estimate: { value: NaN, uncertainty: NaN, observedOrder: NaN },
      growth: { exponent: 0.7, exponentUncertainty: 0.3, theory: 1 },
      readouts: {},
    },
  ];
  return {
    tool: 'peakwise',
    version: '0.1.0',
    model: { title: s('Skid bracket web with a re-entrant notch'), file: s('models/skid-bracket.yaml') },
    units: { length: s('mm'), force: s('N'), stress: s('MPa') },
    mesh: { nodes: 1000, elements: 450, order: 2, minAngleDeg: 45 },
    solution: { dofs: 2000, maxDisplacement: 0.41, reactionSum: [0, 7500], appliedSum: [0, -7500] },
    measure: 'von-mises',
    sites,
  };
}

/** The demo report input: L-shaped LST plate, corner field, three sites, three checks. */
const plate = { nx: 40, ny: 30, width: 400, height: 300, order: 2 as const, lShape: true };

export function demoReportInput(hostile = ''): ReportInput {
  const mesh = gridMesh(plate);
  return {
    model: demoModel(hostile),
    study: demoStudy(hostile),
    mesh,
    geometry: plateGeometry(plate),
    field: cornerField(mesh, [200, 150], 0.4555, 400),
    u: smoothDisplacement(mesh, 400),
    checks: [
      { name: `Kirsch hole, Kt = 3 ${hostile}`, pass: true, detail: `3.004 (Kirsch 1898) ${hostile}` },
      { name: 'Lamé thick ring', pass: true },
      { name: 'Inglis ellipse a/b = 3', pass: false, detail: 'off by 2 %' },
    ],
  };
}

