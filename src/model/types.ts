/**
 * The evaluated model (docs/model-format.md, version 1) as plain data. Every expression has been
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
  /**
   * A polygon; when `pieces` is present (an imported SVG path) the boundary is exactly those
   * pieces, end to end, and `vertices` only sketches it (piece start points and arc midpoints,
   * for bounding boxes and estimates). `source` names the file it came from, for messages.
   */
  | { kind: 'polygon'; vertices: PolygonVertex[]; pieces?: PathPiece[]; source?: string };

/**
 * One piece of an imported boundary, in the geometry stage's curve conventions: lines, circle
 * arcs (φ = startAngle + t·sweep) and ellipse arcs (eccentric anomaly φ = startParam + t·sweep,
 * `a` along the axis turned by `rotation` radians). `from`/`to` are the exact end points.
 */
export type PathPiece =
  | { kind: 'line'; from: Point; to: Point }
  | { kind: 'arc'; center: Point; radius: number; startAngle: number; sweep: number; from: Point; to: Point }
  | {
      kind: 'ellipse-arc'; center: Point; a: number; b: number; rotation: number; startParam: number; sweep: number;
      from: Point; to: Point;
    };

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
  | { kind: 'point'; at: Point }
  /** the whole boundary piece (straight edge, arc, ellipse arc, fillet) nearest the point */
  | { kind: 'piece'; at: Point };

export type Axis = 'x' | 'y';

export interface Support {
  /** the name a load case uses for its own displacement values (`cases.NAME.displace.ID`), when given */
  id?: string;
  where: Selector;
  /** the directions held; for a prescribed displacement, the components that are prescribed */
  fix: { x: boolean; y: boolean };
  keyPath: string;
  /** prescribed (non-zero) displacement of the held directions; absent = held at zero */
  displace?: PrescribedMotion;
}

/** A value over the plate: a number, or an expression of the point's x and y (and params). */
export type FieldValue = number | { expression: string; params: Record<string, number> };

/** A displacement component: a number, or an expression of the node's x and y (and params). */
export type DisplacementValue = FieldValue;

export type PrescribedMotion =
  /** per component; an absent component is free */
  | { kind: 'values'; x?: DisplacementValue; y?: DisplacementValue }
  /**
   * a table of points from a file (x, y, ux, uy per row, flat: 4 numbers a row), interpolated
   * along the selected boundary by arc length; `tolerance` is the farthest a boundary node may
   * lie from every table point
   */
  | { kind: 'table'; file: string; rows: number[]; tolerance?: number };

/**
 * Every load a model can carry, in the order the file lists them: one list, so no caller can
 * forget a kind (the solver, the checks, the sweep and the report all read `Model.loads`).
 */
export type Load =
  /** force per unit edge area (a stress), global x and y */
  | { kind: 'traction'; where: Selector; traction: Point; keyPath: string }
  /** normal pressure, positive pushes on the surface (acts against the outward normal) */
  | { kind: 'pressure'; where: Selector; pressure: number; keyPath: string }
  /** concentrated force over the whole thickness */
  | { kind: 'force'; where: Selector; force: Point; keyPath: string }
  /**
   * far-field stress state: traction σ·n on each selected edge, σ = stress + gradient·(p − about)
   * (σxx, σyy, σxy; each gradient row is [∂/∂x, ∂/∂y])
   */
  | {
      kind: 'stress'; where: Selector; stress: [number, number, number];
      gradient: { sxx: Point; syy: Point; sxy: Point }; about: Point; keyPath: string;
    }
  /** pin force: cosine pressure on the half of an opening facing the force, resultant = force */
  | { kind: 'pinForce'; where: Selector & { kind: 'opening' }; force: Point; keyPath: string }
  /** self-weight: body force ρ·g over the whole plate (acceleration vector, length/time²; needs material.density) */
  | { kind: 'gravity'; gravity: Point; keyPath: string }
  /** rotation at ω (rad/time) about the point `about`: centrifugal body force ρ·ω²·(p − about) (needs material.density) */
  | { kind: 'spin'; about: Point; omega: number; keyPath: string }
  /** temperature change ΔT over the plate, a number or an expression of x and y (needs material.expansion) */
  | { kind: 'temperature'; temperature: FieldValue; keyPath: string };

/** The loads that act on the boundary (through a selector), as opposed to the body loads above. */
export type EdgeLoad = Extract<Load, { where: Selector }>;

/** The loads that act over the whole plate: self-weight, rotation, temperature. */
export type BodyLoad = Exclude<Load, EdgeLoad>;

/**
 * A named load case (docs/model-format.md, "Load cases"): its loads, and the model's supports with this
 * case's displacement values. Every case holds the same dofs (only the values differ), so one
 * factorisation of the stiffness serves all cases.
 */
export interface LoadCase {
  name: string;
  /** this case's loads, every kind, in file order */
  loads: Load[];
  /** the model's supports in order; a support that prescribes displacements carries this case's values */
  supports: Support[];
  keyPath: string;
}

/** A combination: a linear expression of case names, evaluated to one factor per case it names. */
export interface Combination {
  name: string;
  /** the expression as written, e.g. "1.35*dead + 1.5*wind" */
  expression: string;
  /** the factor of each case the expression names (non-zero or not), in the model's case order */
  terms: { case: string; factor: number }[];
  keyPath: string;
}

/** The same as `Load` (kept for code written when far-field and pin loads were a separate list). */
export type AnyLoad = Load;

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
  sites: 'auto' | Point[];
  readouts: {
    /** fixed readout distance; undefined: a fraction of each site's feature length (docs/study.md) */
    distance: number | undefined;
    /** material critical distance of the theory of critical distances (present only when given) */
    critical?: CriticalDistance;
  };
}

/**
 * Critical distance L of the theory of critical distances (D. Taylor, The Theory of Critical Distances,
 * Elsevier 2007): given, or L = (1/π)(ΔK_th/Δσ₀)² from the threshold stress-intensity range ΔK_th
 * (stress·√length) and the plain fatigue limit range Δσ₀ (stress).
 */
export interface CriticalDistance {
  length: number;
  deltaKth?: number;
  deltaSigma0?: number;
}

export interface Material {
  E: number;
  nu: number;
  /**
   * yield stress of the material (stress units), when given: a converged value above it is
   * flagged (the linear-elastic result then expects local yielding)
   */
  yield?: number;
  /** mass per unit volume in the model's consistent units (e.g. tonne/mm³ with N and mm), for gravity and spin loads */
  density?: number;
  /** thermal expansion coefficient α (strain per unit of temperature), for temperature loads */
  expansion?: number;
}

export type PlaneState = 'plane-stress' | 'plane-strain' | 'axisymmetric';

export interface SourcePosition {
  line: number;
  col: number;
}

/** Something in the file that is valid but probably not what the user meant. */
export interface ModelWarning {
  keyPath: string;
  message: string;
}

/**
 * A value another analysis reported at a spot (issue 15; docs/other-analysis.md): its peak of `measure`
 * at `at`, with its typical element edge length `size` there.
 */
export interface ReportedValue {
  at: Point;
  value: number;
  /** the other mesh's typical element edge length at `at` */
  size: number;
  measure: StressMeasure;
  /** load case or combination the value belongs to (absent: the model's loads) */
  case?: string;
  /** free label, e.g. the other run's id */
  label?: string;
  /** element order of the other analysis (1: linear, 2: quadratic); compared with peakwise's own solve of that order */
  order?: 1 | 2;
  /** where it was written: `reported[2]` or `reported[0] (other.csv:5)` */
  keyPath: string;
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
  /**
   * every load of the file, all kinds, in file order; with `cases`, the loads of every case together
   * (for what depends on where loads act: required mesh nodes, point-load sites, selector checks) —
   * a solve takes each case's own list from `cases`
   */
  loads: Load[];
  /** the load cases, when the file has `cases:` (absent: one implicit case holding `loads` and `supports`) */
  cases?: LoadCase[];
  /** combinations of the cases (present only with `cases`) */
  combinations?: Combination[];
  mesh: MeshSettings;
  study: StudySettings;
  /** values another analysis reported (`reported`), when the file lists any */
  reported?: ReportedValue[];
  /** key path (`loads[1].where`) → 1-based position of that key's value in the file */
  sourceMap: Record<string, SourcePosition>;
  /** hints the CLI prints on stderr (e.g. E that looks like it is in other units) */
  warnings?: ModelWarning[];
}
