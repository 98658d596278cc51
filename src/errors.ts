/**
 * Errors that peakwise raises on purpose. The CLI prints these as one clear line
 * (file:line:col key.path: message) and exits with status 1; anything else is a bug.
 *
 * `keyPath` is the path of the offending key in the model file, written the way a
 * user reads it: `loads[1].where`, `plate.openings[0].circle.radius`. The CLI maps it
 * to a line and column through the model's source map.
 */
export type ErrorStage = 'model' | 'geometry' | 'mesh' | 'fem' | 'solve' | 'study' | 'io' | 'usage';

export class PeakwiseError extends Error {
  readonly stage: ErrorStage;
  readonly keyPath: string | undefined;
  /**
   * Other key paths the message names (the earlier of two conflicting entries); the CLI adds
   * their lines so the user finds both.
   */
  readonly related: readonly string[];
  constructor(stage: ErrorStage, message: string, keyPath?: string, related: readonly string[] = []) {
    super(message);
    this.name = 'PeakwiseError';
    this.stage = stage;
    this.keyPath = keyPath;
    this.related = related;
  }
}

/** Bad model file content: syntax, schema, expression or value errors. */
export class ModelError extends PeakwiseError {
  /** 1-based line and column in the file, when the loader knows them. */
  readonly line: number | undefined;
  readonly col: number | undefined;
  constructor(message: string, keyPath?: string, line?: number, col?: number) {
    super('model', message, keyPath);
    this.name = 'ModelError';
    this.line = line;
    this.col = col;
  }
}

/** The plate outline or an opening cannot be built (crossings, oversize fillets, …). */
export class GeometryError extends PeakwiseError {
  constructor(message: string, keyPath?: string) {
    super('geometry', message, keyPath);
    this.name = 'GeometryError';
  }
}

/** The mesher cannot produce a valid mesh (e.g. size far too small, hostile geometry). */
export class MeshError extends PeakwiseError {
  /**
   * The model point the message is about (a required point outside the plate), when it has no
   * key path of its own: the CLI finds the load, support or site that put it there.
   */
  readonly at: readonly [number, number] | undefined;
  constructor(message: string, keyPath?: string, at?: readonly [number, number]) {
    super('mesh', message, keyPath);
    this.name = 'MeshError';
    this.at = at;
  }
}

/** Loads, supports and selectors that do not fit the mesh (a selector matching nothing). */
export class FemError extends PeakwiseError {
  constructor(message: string, keyPath?: string, related?: readonly string[]) {
    super('fem', message, keyPath, related);
    this.name = 'FemError';
  }
}

/** Numerical breakdowns: not positive definite (mechanism), residual too large, too big. */
export class SolveError extends PeakwiseError {
  constructor(message: string, keyPath?: string) {
    super('solve', message, keyPath);
    this.name = 'SolveError';
  }
}

export function isPeakwiseError(e: unknown): e is PeakwiseError {
  return e instanceof PeakwiseError;
}
