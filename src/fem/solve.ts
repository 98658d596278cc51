import { FemError, SolveError } from '../errors.js';
import type { PlateGeometry } from '../geometry/types.js';
import {
  NotPositiveDefiniteError,
  analyze,
  chooseOrdering,
  csrSubmatrix,
  factorize,
  residualNorm,
  solveFactor,
} from '../linalg/index.js';
import type { Csr } from '../linalg/types.js';
import type { Mesh } from '../mesh/types.js';
import type { Load, Support } from '../model/types.js';
import { supportConstraints } from './prescribe.js';
import { assembleStiffness, csrMultiply, stiffnessPattern, type StiffnessPattern } from './assembly.js';
import { appliedResultant, loadVector } from './loads.js';
import { checkRigidRestraint } from './supports.js';
import { checkAxialRestraint, holdAxisNodes } from './axisymmetric.js';
import type { ElasticSection, Solution } from './types.js';
import { validateSolverMesh, validateSection } from './validate.js';
import { RESIDUAL_LIMIT, checkResidual, factorBytes, memoryLimitError, sectionCulprit } from './health.js';

/** A prescribed displacement: dof 2n is u_x of node n, 2n + 1 is u_y. */
export interface PrescribedDisplacement {
  dof: number;
  value: number;
}

export interface PlateProblem {
  mesh: Mesh;
  geometry: Pick<PlateGeometry, 'pieces' | 'loops' | 'scale'>;
  section: ElasticSection;
  supports: readonly Support[];
  /** the model's loads, every kind (`Model.loads`) */
  loads: readonly Load[];
  /**
   * Non-zero (or zero) displacements imposed at single dofs, eliminated like supports.
   * A dof both supported and prescribed takes the prescribed value.
   */
  prescribed?: readonly PrescribedDisplacement[];
  /** extra nodal forces (whole thickness) added to the model loads, e.g. a traction field */
  extraLoad?: Float64Array;
  /** the mesh's stiffness pattern when the caller already has it */
  pattern?: StiffnessPattern;
  /** refuse to factorise when the factor would need more bytes than this (checked after the symbolic analysis) */
  maxFactorBytes?: number;
  /** largest accepted scaled residual (default RESIDUAL_LIMIT, 1e-8); above it the solve is a SolveError */
  residualLimit?: number;
}

const now = (): number => performance.now() / 1000;

/**
 * One linear static solve: assemble K and f, eliminate the fixed dofs (the free-dof principal
 * submatrix K_ff u_f = f_f − K_fc u_c, not a penalty), order, factorise, solve, and recover
 * reactions r = K u − f at the fixed dofs.
 */
export function solvePlate(input: PlateProblem): Solution {
  const { mesh, geometry, section } = input;
  validateSection(section);
  validateSolverMesh(mesh);
  const nNodes = mesh.xy.length / 2;
  const nDof = 2 * nNodes;

  // supports first: a model that cannot be held fails before the costly assembly
  const t0 = now();
  // fixes and displacements of the supports; two supports holding one dof at different
  // values are an error (supportConstraints), explicit `prescribed` entries then win
  const { fixed, value: uFixed } = supportConstraints(mesh, geometry, input.supports);
  for (const [k, p] of (input.prescribed ?? []).entries()) {
    if (!(Number.isInteger(p.dof) && p.dof >= 0 && p.dof < nDof)) {
      throw new FemError(`prescribed[${k}].dof = ${p.dof} is not a dof of the mesh (0 … ${nDof - 1})`, `prescribed[${k}]`);
    }
    if (!Number.isFinite(p.value)) throw new FemError(`prescribed[${k}].value = ${p.value} is not finite`, `prescribed[${k}]`);
    fixed[p.dof] = 1;
    uFixed[p.dof] = p.value;
  }
  if (section.state === 'axisymmetric') {
    // the axis r = 0 holds u_r = 0 by itself; only a translation along the axis is a rigid motion
    holdAxisNodes(mesh.xy, geometry.scale, fixed, uFixed);
    checkAxialRestraint(fixed);
  } else checkRigidRestraint(mesh.xy, fixed, geometry.scale);
  const f = loadVector(mesh, geometry, section, input.loads);
  if (input.extraLoad) {
    if (input.extraLoad.length !== nDof) throw new FemError(`extra load has ${input.extraLoad.length} entries; the mesh has ${nDof} dofs`);
    for (let i = 0; i < nDof; i++) f[i] += input.extraLoad[i];
  }

  let nFree = 0;
  for (let i = 0; i < nDof; i++) if (!fixed[i]) nFree++;
  const free = new Int32Array(nFree);
  for (let i = 0, k = 0; i < nDof; i++) if (!fixed[i]) free[k++] = i;

  const pattern = input.pattern ?? stiffnessPattern(mesh);
  if (pattern.n !== nDof) throw new FemError(`stiffness pattern has ${pattern.n} dofs; the mesh has ${nDof}`);
  const { b, Kff, fixedRows } = reducedSystem(mesh, section, pattern, f, fixed, uFixed, free);
  const t1 = now();

  const rowXY = new Float64Array(2 * nFree);
  for (let k = 0; k < nFree; k++) {
    const n = free[k] >> 1;
    rowXY[2 * k] = mesh.xy[2 * n];
    rowXY[2 * k + 1] = mesh.xy[2 * n + 1];
  }
  let t2 = t1;
  let t3 = t1;
  let nnzL = 0;
  let residual = 0;
  const u = uFixed;
  if (nFree > 0) {
    const ordering = chooseOrdering(Kff, rowXY);
    t2 = now();
    const symbolic = analyze(Kff, ordering);
    if (input.maxFactorBytes !== undefined && factorBytes(symbolic.nnzStored) > input.maxFactorBytes) {
      throw memoryLimitError(factorBytes(symbolic.nnzStored), input.maxFactorBytes, nDof);
    }
    let factor;
    try {
      factor = factorize(Kff, symbolic);
    } catch (err) {
      if (err instanceof NotPositiveDefiniteError) throw sectionCulprit(section) ?? notHeldError(mesh, free, err.dof);
      throw err;
    }
    nnzL = factor.nnzL;
    t3 = now();
    const uFree = solveFactor(factor, b);
    for (let k = 0; k < nFree; k++) u[free[k]] = uFree[k];
    residual = residualNorm(Kff, uFree, b);
    const limit = input.residualLimit ?? RESIDUAL_LIMIT;
    if (!(residual <= limit)) {
      const culprit = sectionCulprit(section);
      if (culprit) throw culprit;
    }
    checkResidual(residual, limit);
  }
  const reaction = new Float64Array(nDof);
  for (let k = 0; k < fixedRows.rows.length; k++) {
    const i = fixedRows.rows[k];
    let s = 0;
    for (let p = fixedRows.rowPtr[k]; p < fixedRows.rowPtr[k + 1]; p++) s += fixedRows.values[p] * u[fixedRows.colIdx[p]];
    reaction[i] = s - f[i];
  }
  const t4 = now();

  let maxDisplacement = 0;
  let maxNode = 0;
  for (let n = 0; n < nNodes; n++) {
    const d = Math.hypot(u[2 * n], u[2 * n + 1]);
    if (d > maxDisplacement) {
      maxDisplacement = d;
      maxNode = n;
    }
  }
  return {
    u,
    reaction,
    load: f,
    fixed,
    dofs: nDof,
    freeDofs: nFree,
    appliedSum: axialOnly(section, appliedResultant(f)),
    reactionSum: axialOnly(section, appliedResultant(reaction)),
    maxDisplacement,
    maxDisplacementAt: [mesh.xy[2 * maxNode], mesh.xy[2 * maxNode + 1]],
    nnzL,
    residual,
    timings: { assembleS: t1 - t0, orderS: t2 - t1, factorS: t3 - t2, solveS: t4 - t3 },
  };
}

/**
 * The resultant of an axisymmetric section's forces is axial only: ring forces in r cancel around
 * the circle (their nodal sum is not a resultant and need not balance), so the r entry is 0.
 */
function axialOnly(section: ElasticSection, sum: [number, number]): [number, number] {
  return section.state === 'axisymmetric' ? [0, sum[1]] : sum;
}

/**
 * Assembles K and reduces it to the free dofs: K_ff, b = f_f − K_fc u_c, and the fixed rows of K
 * (all the reactions need). The full K lives only inside this call, so it can be collected before
 * the factorisation claims its memory.
 */
function reducedSystem(
  mesh: Mesh,
  section: ElasticSection,
  pattern: StiffnessPattern,
  f: Float64Array,
  fixed: Uint8Array,
  uFixed: Float64Array,
  free: Int32Array,
): { b: Float64Array; Kff: Csr; fixedRows: ReturnType<typeof csrRows> } {
  const K = assembleStiffness(mesh, section, pattern);
  const KuFixed = csrMultiply(K, uFixed);
  const b = new Float64Array(free.length);
  for (let k = 0; k < free.length; k++) b[k] = f[free[k]] - KuFixed[free[k]];
  return { b, Kff: csrSubmatrix(K, free), fixedRows: csrRows(K, fixed) };
}

/** the rows of K marked in `mask`, with their original column indices */
function csrRows(K: Csr, mask: Uint8Array): { rows: Int32Array; rowPtr: Int32Array; colIdx: Int32Array; values: Float64Array } {
  let nRows = 0;
  let nnz = 0;
  for (let i = 0; i < K.n; i++) {
    if (mask[i]) {
      nRows++;
      nnz += K.rowPtr[i + 1] - K.rowPtr[i];
    }
  }
  const rows = new Int32Array(nRows);
  const rowPtr = new Int32Array(nRows + 1);
  const colIdx = new Int32Array(nnz);
  const values = new Float64Array(nnz);
  for (let i = 0, k = 0, w = 0; i < K.n; i++) {
    if (!mask[i]) continue;
    rows[k] = i;
    for (let p = K.rowPtr[i]; p < K.rowPtr[i + 1]; p++, w++) {
      colIdx[w] = K.colIdx[p];
      values[w] = K.values[p];
    }
    rowPtr[++k] = w;
  }
  return { rows, rowPtr, colIdx, values };
}

function notHeldError(mesh: Mesh, free: Int32Array, freeIndex: number): SolveError {
  const dof = freeIndex >= 0 && freeIndex < free.length ? free[freeIndex] : -1;
  if (dof < 0) {
    return new SolveError('the stiffness is not positive definite: part of the plate is not held by the supports', 'supports');
  }
  const n = dof >> 1;
  const x = Number(mesh.xy[2 * n].toPrecision(6));
  const y = Number(mesh.xy[2 * n + 1].toPrecision(6));
  return new SolveError(
    `the stiffness is not positive definite at node ${n} (${x}, ${y}), u_${dof & 1 ? 'y' : 'x'}: part of the plate is not held ` +
      '(a piece not connected to the supported part, or a mechanism); connect it or support it',
    'supports',
  );
}
