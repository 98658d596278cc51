import type { Point } from '../model/types.js';

/**
 * A boundary curve. Parameter t runs over [0, 1] from start to end; material lies on the
 * LEFT of the direction of travel (outline counter-clockwise, openings clockwise).
 */
export type Curve =
  | { kind: 'line'; from: Point; to: Point }
  /** circle arc: point(t) = center + radius·(cos φ, sin φ), φ = startAngle + t·sweep (radians, sweep signed) */
  | {
      kind: 'arc'; center: Point; radius: number; startAngle: number; sweep: number;
      /** exact end points (the junctions shared bitwise with the neighbouring pieces); curvePoint returns them at t = 0 and 1 */
      from?: Point; to?: Point;
    }
  /**
   * ellipse arc: point(t) = center + R(rotation)·(a cos φ, b sin φ), φ = startParam + t·sweep
   * (φ is the eccentric-anomaly parameter, radians, sweep signed)
   */
  | {
      kind: 'ellipse-arc'; center: Point; a: number; b: number; rotation: number; startParam: number; sweep: number;
      /** exact end points, as for 'arc' */
      from?: Point; to?: Point;
    };

/** What a boundary piece is, for selectors, features and labels. */
export type PieceRole = 'edge' | 'fillet' | 'circle' | 'ellipse';

export interface BoundaryPiece {
  /** index in PlateGeometry.pieces */
  id: number;
  curve: Curve;
  /** 'outline' or the opening id */
  loop: string;
  role: PieceRole;
  /**
   * fillet radius / circle radius; 0 for straight edges; for an ellipse the smallest radius of
   * curvature b²/a (at the ends of the major axis)
   */
  radius: number;
  /** key path of the feature that made this piece (`plate.outline[3]`, `plate.openings[1]`) */
  keyPath: string;
}

export interface Loop {
  /** 'outline' or the opening id */
  id: string;
  hole: boolean;
  /** piece ids in order of travel; consecutive pieces share an end point exactly */
  pieces: number[];
  keyPath: string;
}

/** A sharp vertex of the boundary (no fillet): where two pieces meet at an angle. */
export interface Corner {
  at: Point;
  /** material (interior) angle in degrees: 90 for a convex rectangle corner, 270 for a re-entrant one */
  interiorAngleDeg: number;
  loop: string;
  /** piece arriving at the corner and piece leaving it */
  pieceIn: number;
  pieceOut: number;
  keyPath: string;
}

export interface PlateGeometry {
  pieces: BoundaryPiece[];
  loops: Loop[];
  corners: Corner[];
  /** exact area (outline minus openings, with arcs exact) */
  area: number;
  bbox: { minX: number; minY: number; maxX: number; maxY: number };
  /** a length scale for tolerances: the bounding-box diagonal */
  scale: number;
  /**
   * The same plate about `origin` (the centre of the outline's bounding box, subtracted from
   * every coordinate), as buildGeometry built and checked it. The mesher meshes this copy and
   * adds `origin` back, so a mesh does not depend on where the plate sits and coordinates far
   * from 0 lose no digits while meshing. Absent on geometries built by hand (meshed as they are).
   */
  local?: { origin: Point; geometry: PlateGeometry };
}
