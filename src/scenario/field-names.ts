/**
 * What the page, the CLI and the report call the field a run computes and its source, by polarization (README
 * "Physics conventions"): TMz grids carry Ez driven by an electric line current I in
 * amperes, TEz grids Hz driven by a magnetic line current M in volts. Charts, tables, the
 * field view, the set-up, the CLI and the report take their labels from here, so they never
 * disagree.
 */
import type { Polarization } from './types.ts';

export interface FieldNames {
  /** The computed component: "Ez" or "Hz". */
  field: 'Ez' | 'Hz';
  /** Its unit: "V/m" or "A/m". */
  unit: 'V/m' | 'A/m';
  /** The source's symbol, its unit and its name in running text. */
  source: 'I' | 'M';
  sourceUnit: 'A' | 'V';
  sourceName: 'current' | 'magnetic current';
  /** The transfer quantity compared with the exact field, "Ez/I" or "Hz/M", and its unit. */
  ratio: 'Ez/I' | 'Hz/M';
  ratioUnit: 'V/(m·A)' | 'A/(m·V)';
}

const TMZ: FieldNames = { field: 'Ez', unit: 'V/m', source: 'I', sourceUnit: 'A', sourceName: 'current', ratio: 'Ez/I', ratioUnit: 'V/(m·A)' };
const TEZ: FieldNames = { field: 'Hz', unit: 'A/m', source: 'M', sourceUnit: 'V', sourceName: 'magnetic current', ratio: 'Hz/M', ratioUnit: 'A/(m·V)' };

/**
 * The names for a polarization; anything but "TEz" (including a scenario that leaves the
 * field out) is TMz, the default.
 *
 * @example
 * fieldNames('TEz').ratio; // "Hz/M"
 */
export function fieldNames(polarization: Polarization | unknown): FieldNames {
  return polarization === 'TEz' ? TEZ : TMZ;
}
