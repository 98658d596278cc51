/**
 * The evaluated model (design.md §3, version 1) as plain data. Every expression has been
 * evaluated to a number; every default has been filled in. Nothing here refers back to the
 * YAML document except `sourceMap`, which maps key paths to file positions for messages.
 */
export type Point = [number, number];

/** A vertex of a polygon outline or polygon opening; `round` > 0 fillets that corner. */
export interface PolygonVertex {
  at: Point;
  /** fillet radius, 0 for a sharp corner */
  round: number;
}

export type Shape =
  | { kind: 'circle'; center: Point; radius: number }
  /** `a` along the local x axis, turned by `angleDeg` counter-clockwise */
  | { kind: 'ellipse'; center: Point; a: number; b: number; angleDeg: number }
  /** axis-aligned rectangle, each corner rounded by `round` (0 = sharp) */
  | { kind: 'rect'; center: Point; width: number; height: number; round: number }
  | { kind: 'polygon'; vertices: PolygonVertex[] };

export interface Opening {
  id: string;
  shape: Shape;
  /** key path of this opening in the file, e.g. `plate.openings[2]` */
  keyPath: string;
}

export interface Plate {
  outline: Shape;
  openings: Opening[];
}

export type Selector =
  | { kind: 'x'; value: number }
  | { kind: 'y'; value: number }
  | { kind: 'segment'; from: Point; to: Point }
  | { kind: 'opening'; id: string }
  | { kind: 'outline' }
  | { kind: 'point'; at: Point };

export type Axis = 'x' | 'y';

export interface Support {
  where: Selector;
  fix: { x: boolean; y: boolean };
  keyPath: string;
}

export type Load =
  /** force per unit edge area (a stress), global x and y */
  | { kind: 'traction'; where: Selector; traction: Point; keyPath: string }
  /** normal pressure, positive pushes on the surface (acts against the outward normal) */
  | { kind: 'pressure'; where: Selector; pressure: number; keyPath: string }
  /** concentrated force over the whole thickness */
  | { kind: 'force'; where: Selector; force: Point; keyPath: string };

export interface LocalSize {
  near: Point;
  size: number;
  radius: number;
}

export interface MeshSettings {
  size: number;
  order: 1 | 2;
  local: LocalSize[];
}

export type StressMeasure = 'von-mises' | 'max-principal' | 'tresca' | 'sxx' | 'syy' | 'sxy';

export interface StudySettings {
  measure: StressMeasure;
  levels: number;
  ratio: number;
  /** 'auto' or explicit points */
  spots: 'auto' | Point[];
  readouts: { distance: number | undefined };
}

export interface Material {
  E: number;
  nu: number;
}

export type PlaneState = 'plane-stress' | 'plane-strain';

export interface SourcePosition {
  line: number;
  col: number;
}

/** Something in the file that is valid but probably not what the user meant. */
export interface ModelWarning {
  keyPath: string;
  message: string;
}

export interface Model {
  title: string;
  /** file the model was read from ('' when built in code) */
  file: string;
  units: { length: string; force: string };
  params: Record<string, number>;
  material: Material;
  thickness: number;
  state: PlaneState;
  plate: Plate;
  supports: Support[];
  loads: Load[];
  mesh: MeshSettings;
  study: StudySettings;
  /** key path (`loads[1].where`) → 1-based position of that key's value in the file */
  sourceMap: Record<string, SourcePosition>;
  /** hints the CLI prints on stderr (e.g. E that looks like it is in other units) */
  warnings?: ModelWarning[];
}
