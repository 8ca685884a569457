/**
 * Stator and rotor geometry: air gap, slot opening, tooth and yoke widths from their flux-density
 * limits, slot shape and area (parallel-sided teeth, trapezoidal slots), end windings, shaft.
 *
 * References:
 * [1] J. Pyrhönen et al., Design of Rotating Electrical Machines, 2nd ed., 2014, §6.2 (tooth width
 *     b_d = Φ_tooth/(k_Fe·l·B_d), yoke height h_y = Φ_m/(2·k_Fe·l·B_y), slot dimensions).
 * [2] D. Hanselman, Brushless Permanent Magnet Motor Design, 2nd ed., 2006, ch. 7 (tooth-coil end turns).
 */
import {
  AIRGAP_BASE_M,
  AIRGAP_PER_BORE_DIAMETER,
  COIL_END_EXTENSION_M,
  SHAFT_SHEAR_STRESS_PA,
  SLOT_OPENING_FRACTION,
  SLOT_OPENING_MAX_M,
  SLOT_OPENING_MIN_M,
} from './defaults.js';

/**
 * Mechanical air gap g = AIRGAP_BASE_M + AIRGAP_PER_BORE_DIAMETER·D (common practice, no source),
 * or the given value.
 * @param boreDiameterM D [m]; @param givenMm target air gap [mm], 0 = rule
 * @returns g [m]
 */
export function airgapLength(boreDiameterM: number, givenMm: number): number {
  return givenMm > 0 ? givenMm / 1000 : AIRGAP_BASE_M + AIRGAP_PER_BORE_DIAMETER * boreDiameterM;
}

/**
 * Slot opening: SLOT_OPENING_FRACTION of the slot pitch, within [SLOT_OPENING_MIN_M, SLOT_OPENING_MAX_M]
 * (common practice, no source).
 * @param slotPitchM τ_s at the bore [m]
 * @returns b_o [m]
 */
export function slotOpening(slotPitchM: number): number {
  return Math.min(SLOT_OPENING_MAX_M, Math.max(SLOT_OPENING_MIN_M, SLOT_OPENING_FRACTION * slotPitchM));
}

/** Tooth-tip height (tip plus wedge) h_tip = max(1 mm, 0.01·D) [m] (common practice, no source). */
export function toothTipHeight(boreDiameterM: number): number {
  return Math.max(1e-3, 0.01 * boreDiameterM);
}

export interface SlotGeometry {
  /** Slot depth below the tooth tip [m]. */
  depthM: number;
  /** Slot width at the top (near the gap) and at the bottom [m]. */
  topWidthM: number;
  bottomWidthM: number;
  /** Slot area available for the winding [m²]. */
  areaM2: number;
}

/**
 * Trapezoidal slot between parallel-sided teeth:
 * h_s = (D_o − D)/2 − h_tip − h_y; b_top = 2π(R + h_tip)/Q − b_t; b_bot = 2π(R + h_tip + h_s)/Q − b_t;
 * A_slot = (b_top + b_bot)/2·h_s ([1] §6.2).
 * @param outerDiameterM D_o [m]; @param boreDiameterM D [m]; @param slots Q [-]
 * @param toothWidthM b_t [m]; @param yokeHeightM h_y [m]; @param tipHeightM h_tip [m]
 */
export function slotGeometry(outerDiameterM: number, boreDiameterM: number, slots: number, toothWidthM: number, yokeHeightM: number, tipHeightM: number): SlotGeometry {
  const depthM = (outerDiameterM - boreDiameterM) / 2 - tipHeightM - yokeHeightM;
  const r1 = boreDiameterM / 2 + tipHeightM;
  const topWidthM = (2 * Math.PI * r1) / slots - toothWidthM;
  const bottomWidthM = (2 * Math.PI * (r1 + Math.max(depthM, 0))) / slots - toothWidthM;
  const areaM2 = depthM > 0 && topWidthM > 0 ? ((topWidthM + bottomWidthM) / 2) * depthM : 0;
  return { depthM, topWidthM, bottomWidthM, areaM2 };
}

/**
 * Length of one coil end (one side of the stack) [m]: a half circle over the coil span at mid-slot
 * plus a straight extension at each side ([2] ch. 7; common practice): tooth coils span the tooth
 * plus half a slot, distributed coils y slot pitches.
 * @param coilPitch y [slots]; @param midSlotPitchM slot pitch at mid-slot [m]
 * @param toothWidthM b_t [m]; @param slotWidthM mean slot width [m]
 * @returns end length per coil end [m] and the axial overhang [m]
 */
export function endWinding(coilPitch: number, midSlotPitchM: number, toothWidthM: number, slotWidthM: number): { lengthM: number; overhangM: number } {
  const span = coilPitch === 1 ? toothWidthM + slotWidthM / 2 : coilPitch * midSlotPitchM;
  return { lengthM: (Math.PI / 2) * span + 2 * COIL_END_EXTENSION_M, overhangM: span / 2 + COIL_END_EXTENSION_M };
}

/**
 * Shaft diameter from torsion, d = (16·T/(π·τ_allow))^(1/3) (strength of materials), with the
 * allowed shear stress SHAFT_SHEAR_STRESS_PA at peak torque.
 * @param peakTorqueNm [N·m]
 * @returns [m]
 */
export function shaftDiameter(peakTorqueNm: number): number {
  return Math.cbrt((16 * peakTorqueNm) / (Math.PI * SHAFT_SHEAR_STRESS_PA));
}
