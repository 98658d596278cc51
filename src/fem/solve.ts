import { FemError, SolveError } from '../errors.js';
import type { PlateGeometry } from '../geometry/types.js';
import {
  NotPositiveDefiniteError,
  analyze,
  chooseOrdering,
  csrSubmatrix,
  factorize,
  releaseFactor,
  residualNorm,
  residualNorms,
  solveFactorMany,
} from '../linalg/index.js';
import type { Csr, Factor } from '../linalg/types.js';
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
  /**
   * a store of stiffness and factors kept from earlier solves of this mesh and section (watch mode:
   * pipeline/reuse.ts); absent, every solve assembles and factorises afresh
   */
  reuse?: StiffnessReuse;
}

/**
 * What a solve keeps of one mesh, section and set of held dofs, for a later solve of the same three:
 * the assembled K (for K_fc u_c of prescribed values), its free-dof block K_ff and fixed rows, and the
 * factor of K_ff (with its ordering and analysis; undefined when no dof is free). Only read after.
 */
export interface KeptStiffness {
  K: Csr;
  Kff: Csr;
  fixedRows: CsrRows;
  factor: Factor | undefined;
}

/**
 * The store `solvePlateCases` asks before assembling (the caller binds it to the mesh and section and
 * keys it on their content): `find` the kept stiffness of these held dofs, `room` before a new factor
 * of `bytes` is made (the store lets go of what does not fit beside it), `keep` a new one — true when
 * kept; `release` is called when the store lets it go (the factor's memory then serves the next
 * factorisation, linalg's releaseFactor), and a factor not kept is released by the solve at once.
 */
export interface StiffnessReuse {
  find(fixed: Uint8Array): KeptStiffness | undefined;
  room(bytes: number): void;
  keep(fixed: Uint8Array, kept: KeptStiffness, release: () => void): boolean;
}

const now = (): number => performance.now() / 1000;

/**
 * One linear static solve: assemble K and f, eliminate the fixed dofs (the free-dof principal
 * submatrix K_ff u_f = f_f − K_fc u_c, not a penalty), order, factorise, solve, and recover
 * reactions r = K u − f at the fixed dofs.
 */
export function solvePlate(input: PlateProblem): Solution {
  return solvePlateCases(input, [{ loads: input.loads, supports: input.supports }])[0];
}

/** One load case of `solvePlateCases`: its loads and the supports with its displacement values. */
export interface PlateCase {
  loads: readonly Load[];
  /** the supports with this case's prescribed values; every case must hold the same dofs */
  supports: readonly Support[];
}

/**
 * Several load cases on one stiffness: assemble K once, order and factorise K_ff once, and solve
 * every case as a right-hand side of that factor (one sweep over it for all cases). The cases must
 * hold the same dofs (only the prescribed values may differ); `input.loads` and `input.supports` are
 * not used, `input.prescribed` and `input.extraLoad` apply to every case. One Solution per case, each
 * equal to a `solvePlate` of that case alone (the factor is the same, the sweeps do the same arithmetic).
 */
export function solvePlateCases(input: PlateProblem, cases: readonly PlateCase[]): Solution[] {
  const { mesh, geometry, section } = input;
  validateSection(section);
  validateSolverMesh(mesh);
  if (cases.length === 0) throw new FemError('no load case to solve');
  const nNodes = mesh.xy.length / 2;
  const nDof = 2 * nNodes;

  // supports first: a model that cannot be held fails before the costly assembly
  const t0 = now();
  // fixes and displacements of the supports; two supports holding one dof at different
  // values are an error (supportConstraints), explicit `prescribed` entries then win
  const constraints = cases.map((c) => supportConstraints(mesh, geometry, c.supports));
  for (const { fixed, value: uFixed } of constraints) {
    for (const [k, p] of (input.prescribed ?? []).entries()) {
      if (!(Number.isInteger(p.dof) && p.dof >= 0 && p.dof < nDof)) {
        throw new FemError(`prescribed[${k}].dof = ${p.dof} is not a dof of the mesh (0 … ${nDof - 1})`, `prescribed[${k}]`);
      }
      if (!Number.isFinite(p.value)) throw new FemError(`prescribed[${k}].value = ${p.value} is not finite`, `prescribed[${k}]`);
      fixed[p.dof] = 1;
      uFixed[p.dof] = p.value;
    }
  }
  const fixed = constraints[0].fixed;
  for (let c = 1; c < cases.length; c++) {
    const other = constraints[c].fixed;
    for (let i = 0; i < nDof; i++) {
      if (other[i] !== fixed[i]) throw new FemError(`load case ${c + 1} holds dof ${i} (node ${i >> 1}) and case 1 does not; every case must hold the same dofs`, 'cases');
    }
  }
  if (section.state === 'axisymmetric') {
    // the axis r = 0 holds u_r = 0 by itself (in every case, at zero); only a translation along the axis is a rigid motion
    for (const c of constraints) holdAxisNodes(mesh.xy, geometry.scale, c.fixed, c.value);
    checkAxialRestraint(fixed);
  } else checkRigidRestraint(mesh.xy, fixed, geometry.scale);
  const forces = cases.map((c) => {
    const f = loadVector(mesh, geometry, section, c.loads);
    if (input.extraLoad) {
      if (input.extraLoad.length !== nDof) throw new FemError(`extra load has ${input.extraLoad.length} entries; the mesh has ${nDof} dofs`);
      for (let i = 0; i < nDof; i++) f[i] += input.extraLoad[i];
    }
    return f;
  });

  let nFree = 0;
  for (let i = 0; i < nDof; i++) if (!fixed[i]) nFree++;
  const free = new Int32Array(nFree);
  for (let i = 0, k = 0; i < nDof; i++) if (!fixed[i]) free[k++] = i;

  // kept from an earlier solve of this mesh, section and held dofs (watch mode), else assembled now
  const kept = input.reuse?.find(fixed);
  const pattern = kept ? undefined : input.pattern ?? stiffnessPattern(mesh);
  if (pattern && pattern.n !== nDof) throw new FemError(`stiffness pattern has ${pattern.n} dofs; the mesh has ${nDof}`);
  const { bs, Kff, fixedRows, K } = reducedSystem(mesh, section, pattern, forces, fixed, constraints.map((c) => c.value), free, kept, input.reuse !== undefined);
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
  const residuals = cases.map(() => 0);
  const us = constraints.map((c) => c.value);
  if (nFree > 0) {
    let factor = kept?.factor;
    // true while the store holds the factor used here (taken from it, or kept now)
    let keptFactor = factor !== undefined;
    if (factor) {
      // the cap is checked as for a new factor (the limits may differ from the solve that made it)
      t2 = t1;
      if (input.maxFactorBytes !== undefined && factorBytes(factor.symbolic.nnzStored) > input.maxFactorBytes) {
        throw memoryLimitError(factorBytes(factor.symbolic.nnzStored), input.maxFactorBytes, nDof);
      }
    } else {
      const ordering = chooseOrdering(Kff, rowXY);
      t2 = now();
      const symbolic = analyze(Kff, ordering);
      if (input.maxFactorBytes !== undefined && factorBytes(symbolic.nnzStored) > input.maxFactorBytes) {
        throw memoryLimitError(factorBytes(symbolic.nnzStored), input.maxFactorBytes, nDof);
      }
      input.reuse?.room(factorBytes(symbolic.nnzStored));
      try {
        factor = factorize(Kff, symbolic);
      } catch (err) {
        if (err instanceof NotPositiveDefiniteError) throw sectionCulprit(section) ?? notHeldError(mesh, free, err.dof);
        throw err;
      }
      // a kept factor's memory is given back when the store lets it go, never while it is kept
      const made = factor;
      keptFactor = input.reuse !== undefined && K !== undefined && input.reuse.keep(fixed, { K, Kff, fixedRows, factor }, () => releaseFactor(made));
    }
    nnzL = factor.nnzL;
    t3 = now();
    const uFrees = solveFactorMany(factor, bs);
    // the factor is used no more: its memory serves the next factorisation (no fresh pages to fault in)
    if (!keptFactor) releaseFactor(factor);
    const limit = input.residualLimit ?? RESIDUAL_LIMIT;
    const scaled = cases.length === 1 ? [residualNorm(Kff, uFrees[0], bs[0])] : residualNorms(Kff, uFrees, bs);
    uFrees.forEach((uFree, c) => {
      const u = us[c];
      for (let k = 0; k < nFree; k++) u[free[k]] = uFree[k];
      const residual = scaled[c];
      residuals[c] = residual;
      if (!(residual <= limit)) {
        const culprit = sectionCulprit(section);
        if (culprit) throw culprit;
      }
      checkResidual(residual, limit);
    });
  }
  const solutions = us.map((u, c) => {
    const f = forces[c];
    const reaction = new Float64Array(nDof);
    for (let k = 0; k < fixedRows.rows.length; k++) {
      const i = fixedRows.rows[k];
      let s = 0;
      for (let p = fixedRows.rowPtr[k]; p < fixedRows.rowPtr[k + 1]; p++) s += fixedRows.values[p] * u[fixedRows.colIdx[p]];
      reaction[i] = s - f[i];
    }
    return { u, reaction, f };
  });
  const t4 = now();
  // the shared work (assembly, ordering, factor) is reported with every case; the sweeps and
  // reactions are shared out evenly
  const solveS = (t4 - t3) / cases.length;
  return solutions.map(({ u, reaction, f }, c) => {
    const { maxDisplacement, maxDisplacementAt } = largestDisplacement(mesh.xy, u);
    return {
      u,
      reaction,
      load: f,
      fixed: c === 0 ? fixed : constraints[c].fixed,
      dofs: nDof,
      freeDofs: nFree,
      appliedSum: axialOnly(section, appliedResultant(f)),
      reactionSum: axialOnly(section, appliedResultant(reaction)),
      maxDisplacement,
      maxDisplacementAt,
      nnzL,
      residual: residuals[c],
      timings: { assembleS: t1 - t0, orderS: t2 - t1, factorS: t3 - t2, solveS },
    };
  });
}

/** The largest nodal displacement |u| and where (the first node on a tie). */
export function largestDisplacement(xy: Float64Array, u: Float64Array): { maxDisplacement: number; maxDisplacementAt: [number, number] } {
  let maxDisplacement = 0;
  let maxNode = 0;
  for (let n = 0; n < xy.length / 2; n++) {
    const d = Math.hypot(u[2 * n], u[2 * n + 1]);
    if (d > maxDisplacement) {
      maxDisplacement = d;
      maxNode = n;
    }
  }
  return { maxDisplacement, maxDisplacementAt: [xy[2 * maxNode], xy[2 * maxNode + 1]] };
}

/**
 * The resultant of an axisymmetric section's forces is axial only: ring forces in r cancel around
 * the circle (their nodal sum is not a resultant and need not balance), so the r entry is 0.
 */
function axialOnly(section: ElasticSection, sum: [number, number]): [number, number] {
  return section.state === 'axisymmetric' ? [0, sum[1]] : sum;
}

/**
 * Assembles K (or takes the kept one) and reduces it to the free dofs: K_ff, b = f_f − K_fc u_c for each
 * case, and the fixed rows of K (all the reactions need). Unless `returnK` (a store will keep it), the
 * full K lives only inside this call, so it can be collected before the factorisation claims its memory.
 */
function reducedSystem(
  mesh: Mesh,
  section: ElasticSection,
  pattern: StiffnessPattern | undefined,
  forces: readonly Float64Array[],
  fixed: Uint8Array,
  uFixeds: readonly Float64Array[],
  free: Int32Array,
  kept: KeptStiffness | undefined,
  returnK: boolean,
): { bs: Float64Array[]; Kff: Csr; fixedRows: CsrRows; K?: Csr } {
  const K = kept ? kept.K : assembleStiffness(mesh, section, pattern ?? stiffnessPattern(mesh));
  const bs = forces.map((f, c) => {
    const b = new Float64Array(free.length);
    // held at zero everywhere (the usual case): K_fc u_c vanishes and the product is skipped
    if (uFixeds[c].every((v) => v === 0)) {
      for (let k = 0; k < free.length; k++) b[k] = f[free[k]];
      return b;
    }
    const KuFixed = csrMultiply(K, uFixeds[c]);
    for (let k = 0; k < free.length; k++) b[k] = f[free[k]] - KuFixed[free[k]];
    return b;
  });
  if (kept) return { bs, Kff: kept.Kff, fixedRows: kept.fixedRows, K };
  return { bs, Kff: csrSubmatrix(K, free), fixedRows: csrRows(K, fixed), ...(returnK ? { K } : {}) };
}

/** Rows of K (those of the held dofs), with their original column indices. */
export interface CsrRows { rows: Int32Array; rowPtr: Int32Array; colIdx: Int32Array; values: Float64Array }

/** the rows of K marked in `mask`, with their original column indices */
function csrRows(K: Csr, mask: Uint8Array): CsrRows {
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
