/**
 * Demagnetisation check: the magnet's working point under the armature field at peak current,
 * against the knee of its normal curve at the worst temperature.
 *
 * References:
 * [1] D. Hanselman, Brushless Permanent Magnet Motor Design, 2nd ed., 2006, ch. 4 (magnetic circuit
 *     of a surface magnet with armature MMF; linear recoil line B_m = B_r + μ0·μ_rec·H_m).
 * [2] J. R. Hendershot, T. J. E. Miller, Design of Brushless Permanent-Magnet Machines, 2010, ch. 3
 *     (demagnetisation: keep the working point above the knee at the hottest temperature for
 *     NdFeB, the coldest for ferrite).
 */
import { COLDEST_MAGNET_TEMPERATURE_C } from './defaults.js';
import { magnetAtTemperature, type MagnetGrade } from './materials.js';

const MU0 = 4e-7 * Math.PI;

export interface MagnetWorkingPoint {
  /** Flux density in the magnet [T]. */
  fluxDensityT: number;
  /** Field strength in the magnet [A/m] (negative: demagnetising). */
  fieldAPerM: number;
}

/**
 * Working point of a surface magnet with an opposing armature MMF F per gap crossing:
 * H_m·l_m + B_m·g'/μ0 = −F and B_m = B_r + μ0·μ_rec·H_m give
 * B_m = (B_r·l_m/μ_rec − μ0·F)/(l_m/μ_rec + g')  ([1] ch. 4).
 * @param remanenceT B_r [T]; @param recoilPermeability μ_rec [-]; @param magnetThicknessM l_m [m]
 * @param gapM g' = k_C·g [m]; @param opposingMmfA F [A]
 */
export function magnetWorkingPoint(remanenceT: number, recoilPermeability: number, magnetThicknessM: number, gapM: number, opposingMmfA: number): MagnetWorkingPoint {
  const lm = magnetThicknessM / recoilPermeability;
  const fluxDensityT = (remanenceT * lm - MU0 * opposingMmfA) / (lm + gapM);
  return { fluxDensityT, fieldAPerM: (fluxDensityT - remanenceT) / (MU0 * recoilPermeability) };
}

export interface DemagnetisationResult {
  /** (H_knee − |H_m|)/H_knee at the worse temperature [%]; negative = irreversible loss. */
  marginPct: number;
  /** Temperature of the worse case [°C]. */
  worstTemperatureC: number;
  /** Field in the magnet at peak current [A/m]. */
  magnetFieldAPerM: number;
  /** Knee field at that temperature [A/m]. */
  kneeFieldAPerM: number;
  /** Flux density in the magnet at peak current [T]. */
  magnetFluxDensityT: number;
}

/**
 * Demagnetisation margin at peak current, checked at the hottest magnet temperature and at the
 * coldest (COLDEST_MAGNET_TEMPERATURE_C), keeping the worse ([2] ch. 3). The peak armature MMF is
 * taken as fully opposing the magnet (a conservative d-axis case: commutation fault or stall).
 * @param grade magnet grade
 * @param hottestC highest magnet temperature [°C]
 * @param magnetThicknessM l_m [m]; @param gapM k_C·g [m]; @param peakMmfA peak armature MMF [A]
 */
export function demagnetisationMargin(grade: MagnetGrade, hottestC: number, magnetThicknessM: number, gapM: number, peakMmfA: number): DemagnetisationResult {
  let worst: DemagnetisationResult | undefined;
  for (const temperatureC of [hottestC, COLDEST_MAGNET_TEMPERATURE_C]) {
    const magnet = magnetAtTemperature(grade, temperatureC);
    const point = magnetWorkingPoint(magnet.remanenceT, grade.recoilPermeability, magnetThicknessM, gapM, peakMmfA);
    const knee = magnet.kneeFieldAPerM;
    const marginPct = knee > 0 ? ((knee - Math.abs(Math.min(point.fieldAPerM, 0))) / knee) * 100 : -100;
    if (!worst || marginPct < worst.marginPct) {
      worst = { marginPct, worstTemperatureC: temperatureC, magnetFieldAPerM: point.fieldAPerM, kneeFieldAPerM: knee, magnetFluxDensityT: point.fluxDensityT };
    }
  }
  return worst as DemagnetisationResult;
}
