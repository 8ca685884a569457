/**
 * Losses of a surface-PM motor: stator iron by region (Steinmetz hysteresis, Bertotti eddy term on
 * the actual flux waveform), magnet eddy currents from the armature's asynchronous MMF harmonics,
 * friction and windage.
 *
 * References:
 * [1] C. P. Steinmetz, "On the law of hysteresis", Trans. AIEE 9, 1892 (p_h = k_h·f·B̂^α).
 * [2] G. Bertotti, "General properties of power losses in soft ferromagnetic materials", IEEE Trans.
 *     Magn. 24(1), 1988 (classical eddy loss for any waveform: p_e = k_e/(2π²)·⟨(dB/dt)²⟩).
 * [3] J. Pyrhönen et al., Design of Rotating Electrical Machines, 2nd ed., 2014: §9.3 (eddy loss of a
 *     plate, P/V = σ·ω²·B̂²·d²/24), §9.6 (friction and windage).
 * [4] N. Bianchi, S. Bolognani, F. Luise, "Potentials and limits of high-speed PM motors", IEEE Trans.
 *     Ind. Appl. 40(6), 2004 — magnet losses from the MMF harmonics that move relative to the rotor
 *     (used here in the resistance-limited estimate).
 */
import type { LaminationSteel } from './materials.js';
import type { WindingAnalysis } from './electrical.js';
import { FRICTION_WINDAGE_COEFF, IRON_LOSS_BUILDING_FACTOR, type Cooling } from './defaults.js';

const MU0 = 4e-7 * Math.PI;
/** Magnets are segmented to pieces no wider than this [m] (common practice, no source). */
export const MAGNET_SEGMENT_WIDTH_M = 20e-3;

export interface IronLoss {
  hysteresisW: number;
  eddyW: number;
}

/**
 * Iron loss of one region carrying a periodic flux density B(θ_e) = Σ B_n·cos(nθ_e + φ_n):
 * hysteresis k_h·f·B̂^α per kg ([1]), eddy k_e·Σ(n·f)²·B_n² per kg (= k_e/(2π²)·⟨(dB/dt)²⟩, [2]),
 * both times IRON_LOSS_BUILDING_FACTOR.
 * @param steel lamination steel
 * @param massKg region mass [kg]
 * @param frequencyHz electrical frequency [Hz]
 * @param peakT peak flux density [T]
 * @param harmonicAmplitudesT B_n for n = 1, 3, 5, … [T]
 */
export function regionIronLoss(steel: LaminationSteel, massKg: number, frequencyHz: number, peakT: number, harmonicAmplitudesT: readonly number[]): IronLoss {
  const hysteresisW = IRON_LOSS_BUILDING_FACTOR * steel.hysteresisCoeff * frequencyHz * peakT ** steel.steinmetzExponent * massKg;
  let sum = 0;
  harmonicAmplitudesT.forEach((b, i) => {
    sum += ((2 * i + 1) * frequencyHz * b) ** 2;
  });
  const eddyW = IRON_LOSS_BUILDING_FACTOR * steel.eddyCoeff * sum * massKg;
  return { hysteresisW, eddyW };
}

/**
 * Eddy-current loss in the magnets from the armature MMF harmonics that move relative to the
 * rotor (resistance-limited plate estimate [3] §9.3, harmonics as in [4]):
 * F_ν = (2/π)·N·I_peak·A_ν/ν with A_ν = |Σ_k ξ_k(ν)·e^{±j2πk/3}|/2 (travelling wave of the three phases),
 * B_ν = μ0·F_ν/g_eff·(R_m/R_s)^ν, f_ν = f_e·|d − ν/p| (d = ±1 direction), and per harmonic
 * P = σ·(2πf_ν)²·B_ν²·w²/24·V_m with w = min(magnet width, segment width MAGNET_SEGMENT_WIDTH_M,
 * half wavelength, stack, 2·skin depth).
 * @returns magnet eddy loss [W]
 */
export function magnetEddyLoss(args: {
  analysis: WindingAnalysis;
  seriesTurns: number;
  rmsCurrentA: number;
  electricalFrequencyHz: number;
  effectiveGapM: number;
  magnetRadiusM: number;
  statorRadiusM: number;
  magnetWidthM: number;
  stackLengthM: number;
  magnetVolumeM3: number;
  conductivitySPerM: number;
  recoilPermeability: number;
}): number {
  const p = args.analysis.layout.poles / 2;
  const iPeak = Math.SQRT2 * args.rmsCurrentA;
  let total = 0;
  for (const h of args.analysis.mmfHarmonics) {
    const nu = h.mechanicalOrder;
    const direction = h.synchronousDirection ? 1 : -1;
    const relative = Math.abs(direction - nu / p);
    if (relative < 1e-9) continue; // the working harmonic is still relative to the rotor
    const f = args.electricalFrequencyHz * relative;
    const omega = 2 * Math.PI * f;
    const mmf = ((2 / Math.PI) * args.seriesTurns * iPeak * h.amplitude) / nu;
    const b = ((MU0 * mmf) / args.effectiveGapM) * (args.magnetRadiusM / args.statorRadiusM) ** nu;
    const skinDepth = Math.sqrt(2 / (omega * MU0 * args.recoilPermeability * Math.max(args.conductivitySPerM, 1e-12)));
    const width = Math.min(args.magnetWidthM, MAGNET_SEGMENT_WIDTH_M, (Math.PI * args.magnetRadiusM) / nu, args.stackLengthM, 2 * skinDepth);
    total += ((args.conductivitySPerM * omega * omega * b * b * width * width) / 24) * args.magnetVolumeM3;
  }
  return total;
}

/**
 * Friction and windage, P = k_ρ·D_r·(L + 0.6·τ_p)·v_r² ([3] §9.6, value from memory).
 * @param rotorDiameterM D_r [m]; @param stackLengthM L [m]; @param polePitchM τ_p [m]
 * @param surfaceSpeedMPerS v_r [m/s]; @param cooling 'tefc' or 'natural'
 * @returns [W]
 */
export function frictionAndWindage(rotorDiameterM: number, stackLengthM: number, polePitchM: number, surfaceSpeedMPerS: number, cooling: Cooling): number {
  return FRICTION_WINDAGE_COEFF[cooling] * rotorDiameterM * (stackLengthM + 0.6 * polePitchM) * surfaceSpeedMPerS ** 2;
}
