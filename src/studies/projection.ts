/**
 * From the 2D check to the user's project (README "3D projection"): the geometry floor on
 * the cell size (the thinnest feature over a number of cells), and the projection of the
 * resolution study's answer onto a 3D Yee grid by the 3D dispersion relation. The 3D numbers
 * are a projection by the dispersion relation, not a 3D run.
 */
import { cubicPhaseLagDeg, project3d, type Projection3d } from '../exact/dispersion3d.ts';
import { stabilityLimit } from '../scenario/layout.ts';
import type { ResolutionStudyPlan } from './resolution-plan.ts';

export interface ProjectionOptions {
  /** 3 asks for the 3D projection (default 2: none). */
  dims?: 2 | 3;
  /** The 3D project's region X, Y, Z in m (absorber not included); needed with dims 3. */
  volume?: [number, number, number];
  /** The thinnest feature the grid must resolve (a substrate, a gap, a wire), m. */
  feature_m?: number;
  /** Cells across that feature (default 4 when a feature is given). */
  cellsPerFeature?: number;
  /** The 3D engine's speed, million Yee cells per second; default: this machine's 2D figure halved (labelled as such). */
  mcells3d?: number;
}

export const DEFAULT_CELLS_PER_FEATURE = 4;

/** The resolution a feature asks for at the study frequency, cells per wavelength (0 without a feature). */
export function featureCellsPerWavelength(plan: ResolutionStudyPlan, o: ProjectionOptions): number {
  if (!(o.feature_m && o.feature_m > 0)) return 0;
  return plan.wavelength_m / (o.feature_m / (o.cellsPerFeature ?? DEFAULT_CELLS_PER_FEATURE));
}

export interface Projection3dResult extends Projection3d {
  /** Where the speed comes from: "given" (--speed) or "estimate: half this machine's measured 2D speed". */
  speed_source: string;
  /** Measured over predicted 2D axis lag at the 2D recommendation, applied to the 3D prediction. */
  measured_over_predicted: number;
  note: string;
}

/**
 * The 3D projection of a resolution study: the 3D dispersion relation along an axis (the
 * worst direction), scaled by what the 2D runs measured against the 2D prediction at the
 * recommended resolution, meeting the same budget over the same size; the time step at the
 * same fraction of the 3D stability limit as the user's 2D Courant number is of the 2D limit.
 */
export function projectTo3d(
  plan: ResolutionStudyPlan, recommended: { axis_deg_per_wavelength: number; predicted_axis_deg_per_wavelength: number } | null,
  mcells2d: number, o: ProjectionOptions, absorberCells: number,
): Projection3dResult | null {
  if (o.dims !== 3 || !o.volume) return null;
  const ratio = recommended && recommended.predicted_axis_deg_per_wavelength > 0 && Number.isFinite(recommended.axis_deg_per_wavelength)
    ? recommended.axis_deg_per_wavelength / recommended.predicted_axis_deg_per_wavelength : 1;
  const fraction = plan.courant / stabilityLimit(1, plan.aspect);
  const c = plan.wavelength_m * plan.frequency_Hz;
  const diagonal = Math.hypot(...o.volume);
  const given = o.mcells3d !== undefined;
  const speed = given ? (o.mcells3d as number) : mcells2d / 2;
  const p = project3d({
    budgetDeg: plan.budget_deg / ratio,
    sizeWavelengths: plan.size_wavelengths,
    courantFraction: Math.min(1, fraction),
    frequency: plan.frequency_Hz,
    waveSpeed: c,
    volume: o.volume,
    absorberCells,
    // ten periods of the pulse and one crossing of the region's diagonal
    simulatedTime: (10 + diagonal / plan.wavelength_m) / plan.frequency_Hz,
    mcellsPerSecond: speed,
    minCellsPerWavelength: featureCellsPerWavelength(plan, o),
  });
  return {
    ...p,
    speed_source: given ? 'given' : 'estimate: half this machine\'s measured 2D speed (six field components per cell instead of three)',
    measured_over_predicted: ratio,
    note: 'a projection by the 3D dispersion relation, not a 3D run',
  };
}

/** Phase lag per wavelength the 3D relation predicts along an axis at N cells per wavelength and the given fraction of the 3D limit, degrees. */
export const axisLag3d = (cellsPerWavelength: number, fraction: number) => cubicPhaseLagDeg(cellsPerWavelength, fraction / Math.sqrt(3), 'axis');
