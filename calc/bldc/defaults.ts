/**
 * Design targets and defaults of the BLDC design, each with its source. Every result lists the
 * values it used (field `assumptions`).
 */

export type Cooling = 'tefc' | 'natural';
export type Objective = 'cost' | 'efficiency' | 'mass';
export type DriveKind = 'six-step' | 'sinusoidal';

export interface DesignTargets {
  /** Air-gap flux density over the magnet [T]. */
  airgapFluxDensityT: number;
  /** Peak tooth flux density [T]. */
  toothFluxDensityT: number;
  /** Peak stator yoke flux density [T]. */
  yokeFluxDensityT: number;
  /** Largest RMS current density in the conductors [A/mm²]. */
  currentDensityAPerMm2: number;
  /** Net copper fill of the slot area [-]. */
  slotFill: number;
  /** Share of the DC bus kept in reserve for control and the inductive drop [%]. */
  voltageMarginPct: number;
  /** Highest magnet temperature, used for performance and the demagnetisation check [°C]. */
  magnetTemperatureC: number;
  /** Winding temperature for resistance [°C]. */
  windingTemperatureC: number;
  /** Magnet pole arc as a fraction of the pole pitch [-]. */
  poleArcFraction: number;
  /** Mechanical air gap [mm]; 0 = from the bore diameter by AIRGAP_BASE_M + AIRGAP_PER_BORE_DIAMETER·D. */
  airgapMm: number;
  /** Drive current limit as a multiple of rated current (start, stall) [-]. */
  currentLimitFactor: number;
  /** Smallest demagnetisation margin accepted [%]. */
  minDemagnetisationMarginPct: number;
}

/**
 * Default targets (REFERENCES.md §7 ranges from the machine-design texts):
 * B_g 0.8 T (common practice for sintered NdFeB surface magnets, §7); tooth 1.6 T (§7: 1.5–2.0 T);
 * yoke 1.4 T (§7: 1.2–1.5 T); current density 5 A/mm² fan-cooled, 3.5 natural (§7: 4–7 and 3–6,
 * from memory); net slot fill 0.45 (§7: 0.35–0.75; random-wound round wire, common practice);
 * voltage margin 10 % (common practice, no source); magnet 100 °C and winding 115 °C (class F
 * insulation used at class B rise, common practice, no source); pole arc 0.8 (common practice);
 * current limit 2 × rated (common practice for drives, no source); demagnetisation margin 10 %
 * (common practice, no source).
 */
export const DEFAULT_TARGETS: Readonly<DesignTargets> = {
  airgapFluxDensityT: 0.8,
  toothFluxDensityT: 1.6,
  yokeFluxDensityT: 1.4,
  currentDensityAPerMm2: 5,
  slotFill: 0.45,
  voltageMarginPct: 10,
  magnetTemperatureC: 100,
  windingTemperatureC: 115,
  poleArcFraction: 0.8,
  airgapMm: 0,
  currentLimitFactor: 2,
  minDemagnetisationMarginPct: 10,
};

/** Current density for natural cooling [A/mm²] (REFERENCES.md §7: 3–6 A/mm², common practice). */
export const NATURAL_COOLING_CURRENT_DENSITY = 3.5;

/**
 * Thermal loading limit as torque per rotor volume [kN·m/m³] by cooling (Hendershot and Miller,
 * Design of Brushless Permanent-Magnet Machines, TRV table, value from memory: sintered NdFeB in
 * small totally enclosed motors 20–30, integral-hp industrial 7–30; natural cooling taken at the
 * ferrite range's top, 14).
 */
export const MAX_TORQUE_PER_ROTOR_VOLUME_KNM_PER_M3: Readonly<Record<Cooling, number>> = { tefc: 30, natural: 14 };

/** Mechanical air gap g = AIRGAP_BASE_M + AIRGAP_PER_BORE_DIAMETER·D [m] (common practice, no source). */
export const AIRGAP_BASE_M = 0.3e-3;
export const AIRGAP_PER_BORE_DIAMETER = 0.004;
/** Magnet leakage factor k_l of the load line [-] (Hanselman ch. 4: 0.9–1.0; 0.95 common practice). */
export const MAGNET_LEAKAGE_FACTOR = 0.95;
/** Slot opening as a fraction of the slot pitch, clamped to [2, 5] mm (common practice, no source). */
export const SLOT_OPENING_FRACTION = 0.12;
export const SLOT_OPENING_MIN_M = 2e-3;
export const SLOT_OPENING_MAX_M = 5e-3;
/** Smallest tooth and slot widths that can be punched and wound [m] (common practice, no source). */
export const MIN_TOOTH_WIDTH_M = 2e-3;
export const MIN_SLOT_WIDTH_M = 2e-3;
/** Smallest magnet thickness [m] and largest as a fraction of the rotor radius (common practice). */
export const MIN_MAGNET_THICKNESS_M = 1e-3;
export const MAX_MAGNET_THICKNESS_FRACTION = 0.25;
/** Rotor core flux density limit [T] (common practice, no source). */
export const ROTOR_YOKE_FLUX_DENSITY_T = 1.5;
/** Allowed shaft shear stress at peak torque [Pa] (common practice, no source). */
export const SHAFT_SHEAR_STRESS_PA = 30e6;
/** Largest rotor surface speed of a surface-magnet rotor with a bandage [m/s] (common practice). */
export const MAX_SURFACE_SPEED_M_PER_S = 60;
/** Largest electrical frequency for 0.35–0.65 mm laminations and the drive [Hz] (common practice). */
export const MAX_ELECTRICAL_FREQUENCY_HZ = 400;
/** Largest strand diameter of a random-wound winding [m] (common practice, no source). */
export const MAX_STRAND_DIAMETER_M = 1.5e-3;
/** Enamel build on the diameter of a round wire [m] (IEC 60317 grade 2, value from memory). */
export const ENAMEL_BUILD_M = 0.06e-3;
/** Largest gross fill (with enamel) of a random-wound slot [-] (REFERENCES.md §7: up to 0.75). */
export const MAX_GROSS_SLOT_FILL = 0.75;
/** Straight extension of each coil end before it bends [m] (common practice, no source). */
export const COIL_END_EXTENSION_M = 5e-3;
/** Permeance factor of the end winding λ_w [-] (Pyrhönen et al. §4.3, 0.2–0.5, value from memory). */
export const END_WINDING_PERMEANCE_FACTOR = 0.3;
/** Iron-loss building factor (punching, assembly) [-] (common practice, no source). */
export const IRON_LOSS_BUILDING_FACTOR = 1.3;
/**
 * Friction and windage P = k_ρ·D_r·(L + 0.6·τ_p)·v² [W] (Pyrhönen et al., §9.6, value from memory),
 * k_ρ by cooling [W·s²/m⁴]: 3 with a shaft fan (a PM rotor needs a smaller fan than a cage rotor), 1.5
 * without (common practice, no source).
 */
export const FRICTION_WINDAGE_COEFF: Readonly<Record<Cooling, number>> = { tefc: 3, natural: 1.5 };
/** Share of the mechanical loss that is bearing friction (∝ speed); the rest is windage (∝ speed³). */
export const FRICTION_SHARE = 0.5;
/** Annealed copper resistivity at 20 °C [Ω·m] and its temperature coefficient [1/K] (IEC 60028). */
export const COPPER_RESISTIVITY_20C = 1.7241e-8;
export const COPPER_TEMP_COEFF = 0.00393;
/** Copper density [kg/m³] and wound-wire price [price units/kg] (common practice, no source). */
export const COPPER_DENSITY = 8890;
export const COPPER_PRICE_PER_KG = 12;
/** Shaft steel density [kg/m³] (value from memory). */
export const SHAFT_STEEL_DENSITY = 7850;
/** Coldest magnet temperature for the demagnetisation check of ferrite [°C] (common practice). */
export const COLDEST_MAGNET_TEMPERATURE_C = -20;

/**
 * Mean DC bus of a six-pulse diode rectifier: V_dc = (3√2/π)·V_LL (Mohan, Undeland, Robbins, Power
 * Electronics, 3rd ed., 2003, Eq. (5-60)), less a drop under load.
 */
export const RECTIFIER_DC_RATIO = (3 * Math.SQRT2) / Math.PI;
/** Drop of the DC bus under load (choke, diodes, line impedance) [-] (common practice, no source). */
export const DC_BUS_LOAD_DROP = 0.03;
