/**
 * Model → problem: the plate geometry, the elastic section, the supports, every load (one list)
 * and the points that must be mesh nodes, built once so that every caller meshes and solves the
 * same thing. What a model file cannot express (a closed form's exact tractions, displacements
 * prescribed at nodes picked from the mesh) rides along as per-mesh hooks.
 */
import { buildGeometry } from '../geometry/index.js';
import type { PlateGeometry } from '../geometry/types.js';
import type { Mesh } from '../mesh/types.js';
import type { Load, MeshSettings, Model, Point, StressMeasure, Support } from '../model/types.js';
import { selectorVertices, type PrescribedDisplacement } from '../fem/index.js';
import type { ElasticSection } from '../fem/types.js';

export interface Problem {
  /** the model the problem was made from (title, units, study settings) */
  model: Model;
  geometry: PlateGeometry;
  section: ElasticSection;
  supports: readonly Support[];
  /** every load, all kinds, in the model's order */
  loads: readonly Load[];
  /** points that must be mesh nodes: point-selector targets and selector ends (selectorVertices), then the extra points; each once */
  requiredPoints: readonly Point[];
  /** the mesh settings after the overrides (`size`, `order`) */
  meshSettings: MeshSettings;
  /** the study measure (von Mises unless the model says otherwise) */
  measure: StressMeasure;
  /** extra nodal forces (whole thickness) on each mesh, e.g. a closed form's exact tractions */
  extraLoad?: (mesh: Mesh) => Float64Array;
  /** displacements prescribed on each mesh at nodes picked from it */
  prescribed?: (mesh: Mesh) => readonly PrescribedDisplacement[];
}

export interface ProblemOptions {
  /** base element size instead of the model's `mesh.size` */
  size?: number;
  /** element order instead of the model's `mesh.order` */
  order?: 1 | 2;
  /** more points that must be mesh nodes (after the model's own) */
  points?: readonly Point[];
  extraLoad?: Problem['extraLoad'];
  prescribed?: Problem['prescribed'];
}

/** Relative tolerance (of the plate's size) under which two required points are one. */
export const SAME_POINT_RELATIVE = 1e-9;

/** The elastic section of a model: material, plane state, thickness (density and expansion when given, for body loads). */
export function sectionOf(model: Pick<Model, 'material' | 'state' | 'thickness'>): ElasticSection {
  const { density, expansion } = model.material;
  return {
    E: model.material.E, nu: model.material.nu, state: model.state, thickness: model.thickness,
    ...(density !== undefined ? { density } : {}),
    ...(expansion !== undefined ? { expansion } : {}),
  };
}

/**
 * Points without repeats, first occurrence kept, in order: two points closer than `tolerance`
 * are one (the mesher wants each required point once). The only deduplication of required
 * points; the study calls it for its per-level points too.
 */
export function uniquePoints(points: Iterable<readonly [number, number]>, tolerance: number): Point[] {
  const out: Point[] = [];
  for (const p of points) if (!out.some((q) => Math.hypot(q[0] - p[0], q[1] - p[1]) <= tolerance)) out.push([p[0], p[1]]);
  return out;
}

/** The problem of a model: geometry, section, supports, all loads, required points (deduplicated once). */
export function problemOf(model: Model, options: ProblemOptions = {}): Problem {
  const geometry = buildGeometry(model.plate);
  // the boundary point each point selector means and the ends of what line selectors catch are mesh
  // vertices (issue 12 §4: selectorVertices)
  const points: Point[] = selectorVertices(model, geometry);
  points.push(...(options.points ?? []));
  return {
    model,
    geometry,
    section: sectionOf(model),
    supports: model.supports,
    loads: model.loads,
    requiredPoints: uniquePoints(points, SAME_POINT_RELATIVE * geometry.scale),
    meshSettings: { size: options.size ?? model.mesh.size, order: options.order ?? model.mesh.order, local: model.mesh.local },
    measure: model.study.measure,
    ...(options.extraLoad ? { extraLoad: options.extraLoad } : {}),
    ...(options.prescribed ? { prescribed: options.prescribed } : {}),
  };
}
