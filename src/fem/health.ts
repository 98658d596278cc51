/**
 * Numerical health of a solve (issue 8): the residual limit, size and memory estimates made
 * before the costly steps, and warnings about models whose numbers should not be trusted
 * blindly. Pure functions on plain data; the CLI prints the warnings and the errors.
 */
import { SolveError } from '../errors.js';
import type { PlateGeometry } from '../geometry/types.js';
import { pointInMaterial } from '../geometry/index.js';
import type { Mesh, SizeField } from '../mesh/types.js';
import type { ElasticSection } from './types.js';

/**
 * Largest accepted scaled residual ‖Ku − f‖∞ / (‖K‖∞‖u‖∞ + ‖f‖∞). A backward-stable Cholesky
 * solve gives about n·ε ≈ 1e-13 on any symmetric positive definite system (Higham 2002,
 * "Accuracy and Stability of Numerical Algorithms", Thm 10.4), so 1e-8 leaves five orders of
 * margin and only trips on a real breakdown (overflow, a factor gone wrong).
 */
export const RESIDUAL_LIMIT = 1e-8;

/** Refuse a solution whose scaled residual is above the limit (or not a number). */
export function checkResidual(residual: number, limit = RESIDUAL_LIMIT): void {
  if (!(residual <= limit)) {
    throw new SolveError(
      `the solve is not trustworthy: scaled residual ‖Ku − f‖ / ‖f‖ = ${Number.isFinite(residual) ? residual.toExponential(2) : String(residual)} ` +
        `is above ${limit.toExponential(0)}; check for extreme stiffness contrasts or values (E, thickness, loads) far out of scale`,
    );
  }
}

/**
 * When a factorisation breaks down or the residual is too large, a section value can be the
 * cause rather than the supports: plane strain near ν = 0.5, whose bulk stiffness
 * E/(3(1 − 2ν)) outgrows the shear stiffness E/(2(1 + ν)) by more than double precision resolves,
 * or an E × thickness so far out of scale that the stiffness entries under- or overflow (doubles
 * hold full precision between about 2.2e-308 and 1.8e308). Returns the error naming that key, or
 * undefined when the section looks sound.
 */
export function sectionCulprit(section: Pick<ElasticSection, 'E' | 'nu' | 'thickness' | 'state'>): SolveError | undefined {
  const { E, nu, thickness, state } = section;
  if ((state === 'plane-strain' || state === 'axisymmetric') && 1 - 2 * nu < 1e-6) {
    const ratio = (2 * (1 + nu)) / (3 * (1 - 2 * nu));
    return new SolveError(
      `nu = ${nu} in ${state === 'axisymmetric' ? 'an axisymmetric section' : 'plane strain'} makes the material almost incompressible: its bulk stiffness is ${ratio.toExponential(1).replace('e+', 'e')} times `
        + 'its shear stiffness, more than the solver resolves in double precision; use nu ≤ 0.4999 (or plane stress), '
        + 'the supports are not the cause',
      'material.nu',
    );
  }
  const stiffness = E * thickness;
  if (!(stiffness > 1e-280 && stiffness < 1e280)) {
    // blame the value further from 1 on a log scale
    const byThickness = Math.abs(Math.log10(thickness)) >= Math.abs(Math.log10(E));
    const [key, what, value] = byThickness ? ['thickness', 'thickness', thickness] : ['material.E', 'E', E];
    return new SolveError(
      `${what} = ${value} makes the stiffness E × thickness = ${stiffness.toExponential(2).replace('e+', 'e')}, `
        + `too ${stiffness <= 1e-280 ? 'small' : 'large'} for double precision (full precision lies between about 1e-308 and 1e308); `
        + `give ${what} in the model's units (the supports are not the cause)`,
      key,
    );
  }
  return undefined;
}

/** measured ratio of real to integrated triangle counts (see estimateMeshSize) */
const CALIBRATION = 1.12;

/** Equilateral triangle area factor: a triangle of edge h has area (√3/4)·h². */
const EQUILATERAL = Math.sqrt(3) / 4;

export interface SizeEstimate {
  triangles: number;
  nodes: number;
  dofs: number;
  /** true when counting stopped early because the estimate passed `stopAbove` dofs */
  exceeded: boolean;
}

/**
 * Size of the mesh a size field will give, before meshing: ∫ dA / ((√3/4)·h(x, y)²) triangles,
 * integrated on a quadtree over the bounding box that splits a cell while it is wider than four
 * local element sizes (so small local disks and curve refinements are seen), each leaf counted
 * when its centre lies in the material. Nodes ≈ triangles / 2 for 3-node and 2·triangles for
 * 6-node triangles (Euler's formula on a large planar triangulation). Stops once the count passes
 * `stopAbove` dofs, so an absurd size costs no more than a sensible one.
 */
export function estimateMeshSize(geometry: PlateGeometry, sizeAt: SizeField, order: 1 | 2, stopAbove = Infinity): SizeEstimate {
  const { minX, minY, maxX, maxY } = geometry.bbox;
  const side = Math.max(maxX - minX, maxY - minY);
  const nodesPerTri = order === 2 ? 2 : 0.5;
  const triLimit = stopAbove / (2 * nodesPerTri);
  let triangles = 0;
  let exceeded = false;
  // explicit stack: x, y (lower-left), size
  const stack: number[] = [minX, minY, side];
  let visits = 0;
  while (stack.length > 0) {
    const s = stack.pop()!;
    const y = stack.pop()!;
    const x = stack.pop()!;
    if (x > maxX || y > maxY) continue;
    const cx = x + s / 2, cy = y + s / 2;
    const h = sizeAt(cx, cy);
    if (!(h > 0) || !Number.isFinite(h)) continue;
    if (s > 4 * h && s > 1e-12 * side && visits < 4_000_000) {
      const t = s / 2;
      stack.push(x, y, t, x + t, y, t, x, y + t, t, x + t, y + t, t);
      visits++;
      continue;
    }
    // clip the leaf to the bounding box and count it when its centre is in the material
    const w = Math.min(s, maxX - x), hgt = Math.min(s, maxY - y);
    if (w <= 0 || hgt <= 0) continue;
    if (!pointInMaterial(geometry, [x + w / 2, y + hgt / 2])) continue;
    triangles += (w * hgt) / (EQUILATERAL * h * h);
    if (triangles > triLimit) {
      exceeded = true;
      break;
    }
  }
  // the refinement's grading and boundary layers add ~10–15 % over the plain integral
  // (measured on the seven demo models: mesh / integral = 1.06 … 1.19)
  triangles = Math.max(1, CALIBRATION * triangles);
  const nodes = triangles * nodesPerTri + 2;
  return { triangles: Math.round(triangles), nodes: Math.round(nodes), dofs: Math.round(2 * nodes), exceeded };
}

/** A solve refused before the work because it would pass a limit: `limit` says which one. */
export class LimitError extends SolveError {
  readonly limit: 'dofs' | 'memory';
  constructor(limit: 'dofs' | 'memory', message: string, keyPath?: string) {
    super(message, keyPath);
    this.limit = limit;
  }
}

/**
 * The message for a model above the dof cap, with the size that would fit. Given the plate's
 * narrow side, a size that would leave fewer than MIN_ELEMENTS_ACROSS elements across it is not
 * offered: a long narrow strip cannot be coarsened into the cap.
 */
export function dofLimitError(
  estimatedDofs: number, maxDofs: number, size: number, how: 'estimated' | 'more-than' | 'counted', plate?: { narrow: number; lengthUnit?: string },
): LimitError {
  // dofs grow like h⁻² for a uniform field, so the base size must grow by √(ratio)
  const factor = Math.sqrt(estimatedDofs / maxDofs);
  const suggested = size * factor * 1.1;
  if (plate && how !== 'more-than' && suggested > plate.narrow / MIN_ELEMENTS_ACROSS) {
    const L = plate.lengthUnit ? ` ${plate.lengthUnit}` : '';
    return new LimitError(
      'dofs',
      `the model would have ${how === 'estimated' ? 'about ' : ''}${fmtCount(estimatedDofs)} degrees of freedom, above --max-dofs ${fmtCount(maxDofs)}; `
        + `a mesh.size that fits (about ${fmtLen(suggested)}${L}) would leave fewer than ${MIN_ELEMENTS_ACROSS} elements across the plate's `
        + `${fmtLen(plate.narrow)}${L} narrow side, so coarsening cannot help: model a shorter length (the rest carried as a load), `
        + 'use larger sizes only away from the details (mesh.local), or raise --max-dofs',
      'mesh.size',
    );
  }
  return new LimitError(
    'dofs',
    `the model would have ${how === 'estimated' ? 'about ' : how === 'more-than' ? 'more than ' : ''}${fmtCount(estimatedDofs)} degrees of freedom` +
      `${how === 'counted' ? ' (counted on the mesh)' : ' (estimated from the plate area and the element sizes, before meshing)'}, above --max-dofs ${fmtCount(maxDofs)}; ` +
      `coarsen it: ${how === 'more-than' ? `a larger mesh.size than ${fmtLen(size)}` : `mesh.size ${fmtLen(size)} → about ${fmtLen(suggested)}`} (or --size), larger mesh.local sizes, or a lower mesh.order; or raise --max-dofs`,
    'mesh.size',
  );
}

/**
 * Bytes the numeric factor will take: the stored panel entries × 8 bytes, plus 25 % for the
 * solver's index arrays, work panels and the right-hand sides (measured overhead of our
 * supernodal factor, docs/linalg.md).
 */
export function factorBytes(nnzStored: number): number {
  return nnzStored * 8 * 1.25;
}

export function memoryLimitError(bytes: number, limit: number, dofs: number): LimitError {
  return new LimitError(
    'memory',
    `factorising ${fmtCount(dofs)} degrees of freedom needs about ${fmtBytes(bytes)} of memory, above the ${fmtBytes(limit)} allowed; ` +
      `coarsen the mesh (a larger mesh.size or --size, larger mesh.local sizes, or mesh.order 1)`,
    'mesh.size',
  );
}

/** Minimum elements per quarter circle on a hole or fillet (see healthWarnings). */
export const MIN_ELEMENTS_PER_QUARTER = 6;

/** Poisson's ratio above which plane-strain CST elements lock. */
export const LOCKING_NU = 0.49;

/** A plate narrower than this many element sizes is modelled by too few elements across. */
export const MIN_ELEMENTS_ACROSS = 3;

/** A plate longer than this many element sizes (on one uniform size) loses digits in the solve. */
export const MAX_ELEMENTS_ALONG = 1e4;

export interface HealthInput {
  section: ElasticSection;
  geometry: PlateGeometry;
  mesh: Mesh;
  /** model mesh size (far from features) */
  size: number;
  /** length unit label for messages */
  lengthUnit?: string;
}

/**
 * Warnings about a mesh and section whose results need care, as plain sentences:
 * - plane strain with ν > 0.49 on 3-node triangles: volumetric locking (the constant-strain
 *   element cannot deform at constant volume; Hughes 2000, "The Finite Element Method", §4.1),
 *   stresses come out too small and noisy — use 6-node triangles;
 * - a hole or fillet with fewer than 6 elements per quarter circle: the peak stress at a
 *   circular hole is off by more than a few percent with fewer (common practice; our own
 *   Kirsch check reaches 1 % at about 8 per quarter with 6-node elements);
 * - a plate less than 3 element sizes across, or more than 10⁴ along: the mesh size does not
 *   fit the plate's proportions;
 * - vertices that no patch of an interior vertex reaches (elements with only boundary corners,
 *   as in a strip one element across): superconvergent patch recovery (Zienkiewicz & Zhu 1992)
 *   assembles patches around interior vertices, so these get a grown or averaged patch instead.
 */
export function healthWarnings(input: HealthInput): string[] {
  const { section, geometry, mesh, size } = input;
  const L = input.lengthUnit ?? '';
  const out: string[] = [];
  if ((section.state === 'plane-strain' || section.state === 'axisymmetric') && section.nu > LOCKING_NU && mesh.order === 1) {
    out.push(
      `${section.state === 'axisymmetric' ? 'an axisymmetric section' : 'plane strain'} with nu = ${section.nu} on 3-node triangles: volumetric locking risk (stresses too low and oscillating); ` +
        'use mesh.order 2 (6-node triangles) or --order 2',
    );
  }
  // elements per quarter circle on each curved feature
  const edgeCount = new Map<string, { edges: number; length: number; radius: number; what: string }>();
  const stride = mesh.edgeStride;
  for (let e = 0; e < mesh.boundaryPiece.length; e++) {
    const piece = geometry.pieces[mesh.boundaryPiece[e]];
    if (!piece || piece.curve.kind === 'line' || !(piece.radius > 0)) continue;
    const key = `${piece.keyPath}|${piece.loop}|${piece.role}`;
    const a = mesh.boundaryEdges[stride * e], b = mesh.boundaryEdges[stride * e + 1];
    const len = Math.hypot(mesh.xy[2 * b] - mesh.xy[2 * a], mesh.xy[2 * b + 1] - mesh.xy[2 * a + 1]);
    const what = piece.role === 'fillet' ? `fillet at ${piece.keyPath}` : `${piece.role} ${piece.loop} (${piece.keyPath})`;
    const rec = edgeCount.get(key) ?? { edges: 0, length: 0, radius: piece.radius, what };
    rec.edges++;
    rec.length += len;
    rec.radius = Math.min(rec.radius, piece.radius);
    edgeCount.set(key, rec);
  }
  for (const rec of edgeCount.values()) {
    const meanEdge = rec.length / rec.edges;
    const perQuarter = (Math.PI / 2) * rec.radius / meanEdge;
    if (perQuarter < MIN_ELEMENTS_PER_QUARTER) {
      out.push(
        `${rec.what}: only ${perQuarter.toFixed(1)} elements per quarter circle (radius ${fmtLen(rec.radius)} ${L}, edges about ${fmtLen(meanEdge)} ${L}); ` +
          `the peak stress there needs at least ${MIN_ELEMENTS_PER_QUARTER} to be within a few percent; refine with mesh.local near it`,
      );
    }
  }
  // proportions of the plate against the mesh size
  const w = geometry.bbox.maxX - geometry.bbox.minX;
  const h = geometry.bbox.maxY - geometry.bbox.minY;
  const narrow = Math.min(w, h), long = Math.max(w, h);
  if (long / narrow > MAX_ELEMENTS_ALONG / MIN_ELEMENTS_ACROSS && (narrow / size < MIN_ELEMENTS_ACROSS || long / size > MAX_ELEMENTS_ALONG)) {
    // no uniform size meets both rules: advising a smaller (or larger) mesh.size would only
    // trade one warning for the other
    out.push(
      `the plate is ${fmtLen(long)} ${L} long and ${fmtLen(narrow)} ${L} across (${fmtCount(Math.round(long / narrow))} to 1): no single mesh.size gives `
        + `${MIN_ELEMENTS_ACROSS} elements across and at most ${fmtCount(MAX_ELEMENTS_ALONG)} along it; keep mesh.size at or below ${fmtLen(narrow / MIN_ELEMENTS_ACROSS)} ${L} `
        + 'near the details that matter (mesh.local) and larger elsewhere, or model a shorter length with the rest carried as a load',
    );
  } else if (narrow / size < MIN_ELEMENTS_ACROSS) {
    out.push(
      `the plate is ${fmtLen(narrow)} ${L} across but mesh.size is ${fmtLen(size)} ${L}: fewer than ${MIN_ELEMENTS_ACROSS} elements across its narrow side, ` +
        'so bending and stress gradients across it are poorly resolved; use a smaller mesh.size',
    );
  } else if (long / size > MAX_ELEMENTS_ALONG) {
    out.push(
      `the plate is ${fmtLen(long)} ${L} long and mesh.size is ${fmtLen(size)} ${L}: more than ${fmtCount(MAX_ELEMENTS_ALONG)} elements along it; ` +
        'a uniform size this small wastes degrees of freedom and digits — use a larger mesh.size with mesh.local refinement',
    );
  }
  // vertices that no interior-vertex patch reaches: every element around them has only boundary
  // corners, so SPR has to fit a grown patch of their own (or fall back to averaging)
  const nV = mesh.nVertices;
  const npe = mesh.nodesPerElem;
  const nE = mesh.elemNodes.length / npe;
  const onBoundary = new Uint8Array(nV);
  for (let e = 0; e < mesh.boundaryPiece.length; e++) {
    for (let k = 0; k < 2; k++) {
      const n = mesh.boundaryEdges[stride * e + k];
      if (n < nV) onBoundary[n] = 1;
    }
  }
  const reached = new Uint8Array(nV);
  for (let e = 0; e < nE; e++) {
    let interior = false;
    for (let k = 0; k < 3; k++) if (!onBoundary[mesh.elemNodes[npe * e + k]]) interior = true;
    if (!interior) continue;
    for (let k = 0; k < 3; k++) reached[mesh.elemNodes[npe * e + k]] = 1;
  }
  let lonely = 0;
  let example = -1;
  for (let n = 0; n < nV; n++) if (!reached[n]) { lonely++; if (example < 0) example = n; }
  if (lonely > 0) {
    out.push(
      `${lonely} node${lonely > 1 ? 's' : ''} (e.g. at (${fmtLen(mesh.xy[2 * example])}, ${fmtLen(mesh.xy[2 * example + 1])})) ` +
        `${lonely > 1 ? 'lie' : 'lies'} in elements with no interior node, so no regular recovery patch reaches ${lonely > 1 ? 'them' : 'it'}: ` +
        'the stress there comes from a grown or averaged patch; read it with care or use a finer mesh',
    );
  }
  return out;
}

function fmtLen(v: number): string {
  return Number(v.toPrecision(3)).toString();
}

function fmtCount(v: number): string {
  if (v >= 1e6) return `${Number((v / 1e6).toPrecision(3))} million`;
  return Math.round(v).toLocaleString('en-US');
}

function fmtBytes(b: number): string {
  if (b >= 2 ** 30) return `${(b / 2 ** 30).toFixed(1)} GiB`;
  if (b >= 2 ** 20) return `${(b / 2 ** 20).toFixed(0)} MiB`;
  return `${Math.ceil(b / 1024)} KiB`;
}
