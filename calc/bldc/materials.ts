/**
 * The material library of the BLDC design: permanent-magnet grades and lamination steels, with
 * temperature behaviour of the magnets. Generic grade designations only (N42, M400-50A are
 * standard designations). The user may pass a custom object of the same shape.
 *
 * References:
 * [1] REFERENCES.md §7: sintered NdFeB and hard ferrite grade data (typical values at 20 °C).
 * [2] EN 10106 / IEC 60404-8-4: a lamination grade "Mxxx-yyA" guarantees xxx/100 W/kg at 1.5 T, 50 Hz
 *     and is yy/100 mm thick.
 * [3] G. Bertotti, "General properties of power losses in soft ferromagnetic materials", IEEE Trans.
 *     Magn. 24(1), 1988 (loss separation: hysteresis ∝ f, classical eddy ∝ f²).
 * [4] D. Hanselman, Brushless Permanent Magnet Motor Design, 2nd ed., 2006, ch. 2 (magnet models,
 *     recoil permeability, the knee of the normal curve).
 * Values marked "value from memory" were not read in a source during collection; prices are
 * "common practice, no source" and are in the price units of the library (any currency the user
 * keeps consistently).
 */
import { CalcInputError } from '../errors.js';

export type MagnetFamily = 'sintered-ndfeb' | 'bonded-ndfeb' | 'ferrite';

export interface MagnetGrade {
  name: string;
  family: MagnetFamily;
  /** Remanence at 20 °C [T]. */
  remanenceT: number;
  /** Intrinsic coercivity at 20 °C [A/m]. */
  intrinsicCoercivityAPerM: number;
  /** Reversible temperature coefficient of remanence α [1/K] (e.g. −0.0012 for −0.12 %/K). */
  remanenceTempCoeffPerK: number;
  /** Reversible temperature coefficient of intrinsic coercivity β [1/K]. */
  coercivityTempCoeffPerK: number;
  /** Recoil relative permeability μ_rec [-]. */
  recoilPermeability: number;
  /** Highest working temperature of the grade [°C]. */
  maxTemperatureC: number;
  /** Density [kg/m³]. */
  densityKgPerM3: number;
  /** Electrical conductivity [S/m] (magnet eddy-current losses). */
  conductivitySPerM: number;
  /** Price [price units/kg]. */
  pricePerKg: number;
  /** Where the numbers come from. */
  source: string;
}

export interface LaminationSteel {
  name: string;
  /** Lamination thickness [m]. */
  thicknessM: number;
  /**
   * Hysteresis coefficient of p_h = k_h·f·B̂^α [W/(kg·Hz·T^α)] (Steinmetz form, excess loss folded in).
   */
  hysteresisCoeff: number;
  /** Steinmetz exponent α [-]. */
  steinmetzExponent: number;
  /** Eddy coefficient of p_e = k_e·f²·B̂² [W/(kg·Hz²·T²)] for sinusoidal flux [3]. */
  eddyCoeff: number;
  /** Flux density above which the steel is taken as saturated [T]. */
  saturationT: number;
  /** Density [kg/m³]. */
  densityKgPerM3: number;
  /** Stacking factor [-]. */
  stackingFactor: number;
  /** Price [price units/kg]. */
  pricePerKg: number;
  source: string;
}

const NDFEB_DENSITY = 7500; // §7 of REFERENCES.md: 7.4–7.6 g/cm³
const NDFEB_RECOIL = 1.05; // §7 of REFERENCES.md
const NDFEB_CONDUCTIVITY = 0.67e6; // 1.5 µΩ·m, value from memory
const KA = 1000;

/**
 * Magnet grades. Sintered NdFeB N35/N42 and M-class values from REFERENCES.md §7 (mid-range
 * remanence, minimum coercivity); H and SH classes follow the same designation rule (value from
 * memory: H ≥ 1353 kA/m, 120 °C; SH ≥ 1592 kA/m, 150 °C); bonded NdFeB (isotropic, compression
 * bonded) value from memory; hard ferrite Y30 class from §7.
 */
export const MAGNET_GRADES: readonly MagnetGrade[] = [
  { name: 'N35', family: 'sintered-ndfeb', remanenceT: 1.19, intrinsicCoercivityAPerM: 955 * KA, remanenceTempCoeffPerK: -0.0012, coercivityTempCoeffPerK: -0.0068, recoilPermeability: NDFEB_RECOIL, maxTemperatureC: 80, densityKgPerM3: NDFEB_DENSITY, conductivitySPerM: NDFEB_CONDUCTIVITY, pricePerKg: 45, source: 'REFERENCES.md §7 (typical grade data); price common practice, no source' },
  { name: 'N42', family: 'sintered-ndfeb', remanenceT: 1.3, intrinsicCoercivityAPerM: 955 * KA, remanenceTempCoeffPerK: -0.0012, coercivityTempCoeffPerK: -0.0068, recoilPermeability: NDFEB_RECOIL, maxTemperatureC: 80, densityKgPerM3: NDFEB_DENSITY, conductivitySPerM: NDFEB_CONDUCTIVITY, pricePerKg: 50, source: 'REFERENCES.md §7; price common practice, no source' },
  { name: 'N35M', family: 'sintered-ndfeb', remanenceT: 1.19, intrinsicCoercivityAPerM: 1114 * KA, remanenceTempCoeffPerK: -0.0012, coercivityTempCoeffPerK: -0.0065, recoilPermeability: NDFEB_RECOIL, maxTemperatureC: 100, densityKgPerM3: NDFEB_DENSITY, conductivitySPerM: NDFEB_CONDUCTIVITY, pricePerKg: 50, source: 'REFERENCES.md §7; price common practice, no source' },
  { name: 'N42M', family: 'sintered-ndfeb', remanenceT: 1.3, intrinsicCoercivityAPerM: 1114 * KA, remanenceTempCoeffPerK: -0.0012, coercivityTempCoeffPerK: -0.0065, recoilPermeability: NDFEB_RECOIL, maxTemperatureC: 100, densityKgPerM3: NDFEB_DENSITY, conductivitySPerM: NDFEB_CONDUCTIVITY, pricePerKg: 55, source: 'REFERENCES.md §7; price common practice, no source' },
  { name: 'N35H', family: 'sintered-ndfeb', remanenceT: 1.19, intrinsicCoercivityAPerM: 1353 * KA, remanenceTempCoeffPerK: -0.0011, coercivityTempCoeffPerK: -0.006, recoilPermeability: NDFEB_RECOIL, maxTemperatureC: 120, densityKgPerM3: NDFEB_DENSITY, conductivitySPerM: NDFEB_CONDUCTIVITY, pricePerKg: 55, source: 'value from memory (H class rule); price common practice, no source' },
  { name: 'N42H', family: 'sintered-ndfeb', remanenceT: 1.3, intrinsicCoercivityAPerM: 1353 * KA, remanenceTempCoeffPerK: -0.0011, coercivityTempCoeffPerK: -0.006, recoilPermeability: NDFEB_RECOIL, maxTemperatureC: 120, densityKgPerM3: NDFEB_DENSITY, conductivitySPerM: NDFEB_CONDUCTIVITY, pricePerKg: 60, source: 'value from memory (H class rule); price common practice, no source' },
  { name: 'N38SH', family: 'sintered-ndfeb', remanenceT: 1.23, intrinsicCoercivityAPerM: 1592 * KA, remanenceTempCoeffPerK: -0.0011, coercivityTempCoeffPerK: -0.0055, recoilPermeability: NDFEB_RECOIL, maxTemperatureC: 150, densityKgPerM3: NDFEB_DENSITY, conductivitySPerM: NDFEB_CONDUCTIVITY, pricePerKg: 70, source: 'value from memory (SH class rule); price common practice, no source' },
  { name: 'bonded NdFeB (isotropic)', family: 'bonded-ndfeb', remanenceT: 0.68, intrinsicCoercivityAPerM: 700 * KA, remanenceTempCoeffPerK: -0.0013, coercivityTempCoeffPerK: -0.004, recoilPermeability: 1.2, maxTemperatureC: 120, densityKgPerM3: 6000, conductivitySPerM: 0.015e6, pricePerKg: 40, source: 'value from memory; price common practice, no source' },
  { name: 'ferrite Y30', family: 'ferrite', remanenceT: 0.385, intrinsicCoercivityAPerM: 220 * KA, remanenceTempCoeffPerK: -0.002, coercivityTempCoeffPerK: 0.003, recoilPermeability: 1.1, maxTemperatureC: 250, densityKgPerM3: 4900, conductivitySPerM: 1e-4, pricePerKg: 3, source: 'REFERENCES.md §7 (Y30 class); recoil permeability value from memory; price common practice, no source' },
];

/**
 * Eddy coefficient of the classical loss of a lamination, k_e = π²·σ·d²/(6·ρ_m) [W/(kg·Hz²·T²)],
 * Eq. (3.x) of Bertotti [3] (classical term), multiplied by an allowance for excess loss.
 * @param thicknessM lamination thickness d [m]
 * @param resistivityOhmM steel resistivity [Ω·m]
 * @param densityKgPerM3 steel density [kg/m³]
 */
export function classicalEddyCoeff(thicknessM: number, resistivityOhmM: number, densityKgPerM3: number): number {
  return (Math.PI ** 2 * thicknessM ** 2) / (6 * resistivityOhmM * densityKgPerM3);
}

/** Excess-loss allowance on the classical eddy term [-] (common practice, no source). */
export const EXCESS_LOSS_FACTOR = 1.5;
/** Steinmetz exponent of the hysteresis term [-] (value from memory: 1.6–2.2 for silicon steels). */
export const STEINMETZ_EXPONENT = 2;

function steel(name: string, specificLossAt15T50Hz: number, thicknessMm: number, resistivityOhmM: number, saturationT: number, pricePerKg: number): LaminationSteel {
  const densityKgPerM3 = resistivityOhmM > 45e-8 ? 7600 : 7650; // higher silicon, lower density (value from memory)
  const eddyCoeff = EXCESS_LOSS_FACTOR * classicalEddyCoeff(thicknessMm / 1000, resistivityOhmM, densityKgPerM3);
  // The grade's guaranteed loss at 1.5 T, 50 Hz [2] minus the eddy part gives the hysteresis part.
  const hysteresisCoeff = (specificLossAt15T50Hz - eddyCoeff * 50 ** 2 * 1.5 ** 2) / (50 * 1.5 ** STEINMETZ_EXPONENT);
  return {
    name,
    thicknessM: thicknessMm / 1000,
    hysteresisCoeff,
    steinmetzExponent: STEINMETZ_EXPONENT,
    eddyCoeff,
    saturationT,
    densityKgPerM3,
    stackingFactor: thicknessMm >= 0.5 ? 0.97 : 0.96,
    pricePerKg,
    source: `EN 10106 grade designation (${specificLossAt15T50Hz} W/kg at 1.5 T, 50 Hz); resistivity, saturation and density value from memory; split by Bertotti [3]; price common practice, no source`,
  };
}

/** Non-oriented lamination steels (EN 10106 designations). */
export const LAMINATION_STEELS: readonly LaminationSteel[] = [
  steel('M800-65A', 8.0, 0.65, 25e-8, 2.0, 1.6),
  steel('M530-50A', 5.3, 0.5, 30e-8, 1.95, 1.8),
  steel('M400-50A', 4.0, 0.5, 42e-8, 1.9, 2.0),
  steel('M330-35A', 3.3, 0.35, 52e-8, 1.85, 2.4),
  steel('M270-35A', 2.7, 0.35, 59e-8, 1.8, 2.8),
];

/** Default magnet grade: an H-class sintered NdFeB that stands 120 °C (common practice). */
export const DEFAULT_MAGNET = 'N42H';
/** Default lamination steel: a 0.35 mm grade, usual for IE4-and-better PM motors (common practice, no source). */
export const DEFAULT_STEEL = 'M330-35A';

/**
 * Finds a magnet grade by name (case-insensitive) or checks a custom one.
 * @param magnet grade name or a custom MagnetGrade
 * @param field input field name for errors
 * @throws CalcInputError for an unknown name or a custom grade with impossible values
 */
export function resolveMagnet(magnet: string | MagnetGrade | undefined, field = 'magnet'): MagnetGrade {
  if (magnet === undefined) return resolveMagnet(DEFAULT_MAGNET, field);
  if (typeof magnet === 'string') {
    const found = MAGNET_GRADES.find((grade) => grade.name.toLowerCase() === magnet.toLowerCase());
    if (!found) throw new CalcInputError(field, `must be one of ${MAGNET_GRADES.map((g) => g.name).join(', ')} or a custom grade`);
    return found;
  }
  const positives: Array<[keyof MagnetGrade, number]> = [
    ['remanenceT', magnet.remanenceT],
    ['intrinsicCoercivityAPerM', magnet.intrinsicCoercivityAPerM],
    ['recoilPermeability', magnet.recoilPermeability],
    ['densityKgPerM3', magnet.densityKgPerM3],
  ];
  for (const [key, value] of positives) {
    if (!Number.isFinite(value) || value <= 0) throw new CalcInputError(`${field}.${key}`, 'must be positive');
  }
  if (magnet.remanenceT > 1.6) throw new CalcInputError(`${field}.remanenceT`, 'must be at most 1.6 T');
  return magnet;
}

/**
 * Finds a lamination steel by name (case-insensitive) or checks a custom one.
 * @throws CalcInputError for an unknown name or impossible values
 */
export function resolveSteel(lamination: string | LaminationSteel | undefined, field = 'steel'): LaminationSteel {
  if (lamination === undefined) return resolveSteel(DEFAULT_STEEL, field);
  if (typeof lamination === 'string') {
    const found = LAMINATION_STEELS.find((grade) => grade.name.toLowerCase() === lamination.toLowerCase());
    if (!found) throw new CalcInputError(field, `must be one of ${LAMINATION_STEELS.map((g) => g.name).join(', ')} or a custom steel`);
    return found;
  }
  const positives: Array<[keyof LaminationSteel, number]> = [
    ['thicknessM', lamination.thicknessM],
    ['saturationT', lamination.saturationT],
    ['densityKgPerM3', lamination.densityKgPerM3],
    ['stackingFactor', lamination.stackingFactor],
  ];
  for (const [key, value] of positives) {
    if (!Number.isFinite(value) || value <= 0) throw new CalcInputError(`${field}.${key}`, 'must be positive');
  }
  if (!(lamination.hysteresisCoeff >= 0) || !(lamination.eddyCoeff >= 0)) throw new CalcInputError(`${field}.hysteresisCoeff`, 'must be zero or more');
  return lamination;
}

/** Magnet properties at one temperature. */
export interface MagnetAtTemperature {
  remanenceT: number;
  intrinsicCoercivityAPerM: number;
  /** Field strength at the knee of the normal curve, taken as 0.9·H_cJ(T) [A/m] (common practice). */
  kneeFieldAPerM: number;
}

/** Knee field as a fraction of intrinsic coercivity [-] (common practice, no source; square intrinsic loop). */
export const KNEE_FRACTION_OF_COERCIVITY = 0.9;

/**
 * Remanence and coercivity at a temperature by the linear reversible coefficients:
 * B_r(T) = B_r20·(1 + α·(T − 20)), H_cJ(T) = H_cJ20·(1 + β·(T − 20)) (Hanselman [4], ch. 2).
 * @param grade magnet grade
 * @param temperatureC magnet temperature [°C]
 * @returns remanence [T], intrinsic coercivity and knee field [A/m]
 */
export function magnetAtTemperature(grade: MagnetGrade, temperatureC: number): MagnetAtTemperature {
  const dT = temperatureC - 20;
  const remanenceT = grade.remanenceT * (1 + grade.remanenceTempCoeffPerK * dT);
  const intrinsicCoercivityAPerM = Math.max(0, grade.intrinsicCoercivityAPerM * (1 + grade.coercivityTempCoeffPerK * dT));
  return { remanenceT, intrinsicCoercivityAPerM, kneeFieldAPerM: KNEE_FRACTION_OF_COERCIVITY * intrinsicCoercivityAPerM };
}
