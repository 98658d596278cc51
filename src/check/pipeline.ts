/**
 * The product pipeline as the check cases use it: a Model built in code → geometry → mesh
 * (the model's size settings) → solve → Gauss stresses → SPR. Extra inputs the model file
 * cannot express (exact traction fields of a closed form, prescribed displacements) are passed
 * straight to the solver, exactly as the library API allows.
 */
import { buildGeometry } from '../geometry/index.js';
import type { PlateGeometry } from '../geometry/types.js';
import { meshPlate, sizeFieldFromSettings } from '../mesh/index.js';
import type { Mesh } from '../mesh/types.js';
import { DEFAULT_STUDY } from '../model/index.js';
import type { Load, LocalSize, Material, Model, Plate, Point, Support } from '../model/types.js';
import { edgeTractionLoad, gaussStresses, solvePlate, type PrescribedDisplacement } from '../fem/index.js';
import type { ElasticSection, GaussStresses, Solution } from '../fem/types.js';
import { recoverSpr } from '../recovery/index.js';
import type { NodalStress } from '../recovery/types.js';

export interface CaseModelInput {
  title: string;
  plate: Plate;
  material: Material;
  state?: Model['state'];
  thickness?: number;
  supports?: Support[];
  loads?: Load[];
  size: number;
  order?: 1 | 2;
  local?: LocalSize[];
}

/** A complete Model object built in code (no file behind it). */
export function caseModel(input: CaseModelInput): Model {
  return {
    title: input.title,
    file: '',
    units: { length: 'mm', force: 'N' },
    params: {},
    material: input.material,
    thickness: input.thickness ?? 1,
    state: input.state ?? 'plane-stress',
    plate: input.plate,
    supports: input.supports ?? [],
    loads: input.loads ?? [],
    mesh: { size: input.size, order: input.order ?? 2, local: input.local ?? [] },
    study: { ...DEFAULT_STUDY, readouts: { distance: undefined } },
    sourceMap: {},
  };
}

export interface Solved {
  model: Model;
  geometry: PlateGeometry;
  mesh: Mesh;
  section: ElasticSection;
  solution: Solution;
  gauss: GaussStresses;
  field: NodalStress;
}

/** Cartesian stress (σxx, σyy, τxy) of a closed form at a point. */
export type StressField = (x: number, y: number) => { sxx: number; syy: number; sxy: number };

export interface SolveExtras {
  /** points that must be mesh nodes */
  requiredPoints?: Point[];
  /** the closed-form stress whose traction t = σ·n is applied on the chosen boundary edges */
  exactTraction?: { stress: StressField; onEdge(x: number, y: number): boolean };
  /** displacements prescribed at nodes picked from the mesh once it exists */
  prescribe?(mesh: Mesh): PrescribedDisplacement[];
}

export function solveModel(model: Model, extras: SolveExtras = {}): Solved {
  const geometry = buildGeometry(model.plate);
  const sizeAt = sizeFieldFromSettings(geometry, { size: model.mesh.size, local: model.mesh.local });
  const mesh = meshPlate(geometry, { sizeAt, order: model.mesh.order, requiredPoints: extras.requiredPoints });
  const section: ElasticSection = { E: model.material.E, nu: model.material.nu, state: model.state, thickness: model.thickness };
  let extraLoad: Float64Array | undefined;
  if (extras.exactTraction) {
    const { stress, onEdge } = extras.exactTraction;
    const edges: number[] = [];
    const st = mesh.edgeStride;
    for (let k = 0; k < mesh.boundaryPiece.length; k++) {
      const a = mesh.boundaryEdges[st * k], b = mesh.boundaryEdges[st * k + 1];
      const mx = 0.5 * (mesh.xy[2 * a] + mesh.xy[2 * b]);
      const my = 0.5 * (mesh.xy[2 * a + 1] + mesh.xy[2 * b + 1]);
      if (onEdge(mx, my)) edges.push(k);
    }
    extraLoad = edgeTractionLoad(mesh, edges, section.thickness, (x, y, nx, ny) => {
      const s = stress(x, y);
      return [s.sxx * nx + s.sxy * ny, s.sxy * nx + s.syy * ny];
    });
  }
  const prescribed = extras.prescribe ? extras.prescribe(mesh) : undefined;
  const solution = solvePlate({ mesh, geometry, section, supports: model.supports, loads: model.loads, prescribed, extraLoad });
  const gauss = gaussStresses(mesh, solution.u, section);
  const field = recoverSpr(mesh, gauss, section);
  return { model, geometry, mesh, section, solution, gauss, field };
}

/** The mesh node closest to (x, y). */
export function nearestNode(mesh: Pick<Mesh, 'xy'>, x: number, y: number): number {
  let best = 0;
  let bestD = Infinity;
  for (let n = 0; n < mesh.xy.length / 2; n++) {
    const d = Math.hypot(mesh.xy[2 * n] - x, mesh.xy[2 * n + 1] - y);
    if (d < bestD) {
      bestD = d;
      best = n;
    }
  }
  return best;
}

/** Every node within `tol` of a predicate line, as node ids. */
export function nodesWhere(mesh: Pick<Mesh, 'xy'>, test: (x: number, y: number) => boolean): number[] {
  const out: number[] = [];
  for (let n = 0; n < mesh.xy.length / 2; n++) if (test(mesh.xy[2 * n], mesh.xy[2 * n + 1])) out.push(n);
  return out;
}

export function relError(value: number, reference: number): number {
  return Math.abs(value - reference) / Math.abs(reference);
}
