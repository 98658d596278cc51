/**
 * A complete Model built in code from its parts (no file behind it): what the check cases and the
 * benchmark hand to `problemOf`, so they go through the same pipeline as a model file.
 */
import { DEFAULT_STUDY } from '../model/index.js';
import type { Load, LocalSize, Material, Model, Plate, Support } from '../model/types.js';

export interface ModelParts {
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
  /** study settings beyond the defaults (measure, levels, ratio, …) */
  study?: Partial<Model['study']>;
}

/** The Model of the parts: millimetres and newtons, plane stress, thickness 1, LST and the default study unless given. */
export function modelFromParts(parts: ModelParts): Model {
  return {
    title: parts.title,
    file: '',
    units: { length: 'mm', force: 'N' },
    params: {},
    material: parts.material,
    thickness: parts.thickness ?? 1,
    state: parts.state ?? 'plane-stress',
    plate: parts.plate,
    supports: parts.supports ?? [],
    loads: parts.loads ?? [],
    mesh: { size: parts.size, order: parts.order ?? 2, local: parts.local ?? [] },
    study: { ...DEFAULT_STUDY, readouts: { distance: undefined }, ...parts.study },
    sourceMap: {},
  };
}
