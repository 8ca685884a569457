/**
 * One analytic design of a surface-PM BLDC motor for one slot/pole combination and one set of
 * continuous variables (split ratio, outer diameter, stack length or current density): geometry,
 * magnet, field, EMF, turns, wire, resistance, inductances, losses, masses, cost, demagnetisation
 * and every limit checked.
 *
 * The steps and their sources:
 * 1. Torque T = P/ω; rotor volume checked as torque per rotor volume TRV = T/V_r and shear stress
 *    σ = T/(2·V_r) (Pyrhönen et al., Design of Rotating Electrical Machines, 2014, Eq. (6.3) form
 *    T = 2σV_r; Hendershot and Miller, TRV table).
 * 2. Magnet thickness from the load line with Carter's coefficient and leakage (Hanselman ch. 4;
 *    Carter 1926 in Pyrhönen Eq. (3.1)); field waveform by Zhu, Howe, Bolte, Ackermann 1993.
 * 3. Tooth and yoke from peak tooth and yoke flux of that waveform (Pyrhönen §6.2).
 * 4. Stack length (or current density) from T = K·L·N·I with N·I = Q·J·k_fill·A_slot/6, K from the
 *    EMF waveform by energy conversion (Hanselman ch. 6).
 * 5. Turns from the DC bus with a voltage margin; wire from current density; resistance; inductances
 *    (winding function, slot and end leakage: Pyrhönen §4.2–4.3).
 * 6. Losses (losses.ts, drive.ts), masses, cost, demagnetisation (demagnetisation.ts).
 */
import type { BldcLossModel, BldcSimulationParams, DriveLossModel, PartLoadCurve } from '../contracts.js';
import { carterCoefficient, loadLineFluxDensity, magnetThicknessFor, radialFieldHarmonics, FIELD_HARMONIC_COUNT } from './airgap.js';
import {
  COPPER_DENSITY,
  COPPER_PRICE_PER_KG,
  END_WINDING_PERMEANCE_FACTOR,
  ENAMEL_BUILD_M,
  FRICTION_SHARE,
  MAGNET_LEAKAGE_FACTOR,
  MAX_ELECTRICAL_FREQUENCY_HZ,
  MAX_GROSS_SLOT_FILL,
  MAX_MAGNET_THICKNESS_FRACTION,
  MAX_STRAND_DIAMETER_M,
  MAX_SURFACE_SPEED_M_PER_S,
  MAX_TORQUE_PER_ROTOR_VOLUME_KNM_PER_M3,
  MIN_MAGNET_THICKNESS_M,
  MIN_SLOT_WIDTH_M,
  MIN_TOOTH_WIDTH_M,
  ROTOR_YOKE_FLUX_DENSITY_T,
  SHAFT_STEEL_DENSITY,
  type Cooling,
  type DesignTargets,
  type DriveKind,
  type Objective,
} from './defaults.js';
import { driveInputPowerFactor, driveLossModel, driveLossW } from './drive.js';
import { demagnetisationMargin, type DemagnetisationResult } from './demagnetisation.js';
import {
  COS_TABLE,
  WAVEFORM_SAMPLES,
  copperResistivity,
  inductancesPerTurn,
  peakArmatureMmf,
  peakLineEmf,
  phaseResistance,
  torqueConstants,
  unitPhaseEmfs,
  type WindingAnalysis,
} from './electrical.js';
import type { FrameLimits } from './frames.js';
import { airgapLength, endWinding, shaftDiameter, slotGeometry, slotOpening, toothTipHeight } from './geometry.js';
import { frictionAndWindage, magnetEddyLoss, regionIronLoss } from './losses.js';
import { magnetAtTemperature, type LaminationSteel, type MagnetGrade } from './materials.js';

/** A fully resolved request (see search.ts for how inputs become a spec). */
export interface BldcSpec {
  ratedPowerW: number;
  speedRpm: number;
  dcBusV: number;
  cooling: Cooling;
  drive: DriveKind;
  frame: FrameLimits;
  magnet: MagnetGrade;
  steel: LaminationSteel;
  targets: DesignTargets;
  objective: Objective;
  minEfficiencyPct?: number;
}

/** The design variables of one candidate. */
export interface Candidate {
  splitRatio: number;
  outerDiameterM: number;
  /** Either the current density fraction of the target (stack follows) or a stack length (J follows). */
  stack: { kind: 'current-density'; fraction: number } | { kind: 'length'; lengthM: number };
}

export interface Constraint {
  name: string;
  value: number;
  limit: number;
  unit: string;
  sense: 'max' | 'min';
  satisfied: boolean;
  /** value/limit for a maximum, limit/value for a minimum [-]; above 1 = violated. */
  utilisation: number;
}

/** Load fractions of the part-load curve (contract: 0.1–1.25). */
export const PART_LOAD_FRACTIONS = [0.1, 0.2, 0.25, 0.3, 0.4, 0.5, 0.6, 0.7, 0.75, 0.8, 0.9, 1, 1.1, 1.25];

export interface BldcDesign {
  feasible: boolean;
  limitingConstraint: string;
  constraints: Constraint[];
  objectiveValue: number;
  slots: number;
  poles: number;
  layers: 1 | 2;
  coilPitch: number;
  windingFactor: number;
  turnsPerPhase: number;
  turnsPerCoil: number;
  parallelPaths: number;
  geometry: {
    statorOuterDiameterMm: number;
    boreDiameterMm: number;
    stackLengthMm: number;
    airgapMm: number;
    magnetThicknessMm: number;
    magnetArcFraction: number;
    rotorOuterDiameterMm: number;
    rotorCoreDiameterMm: number;
    shaftDiameterMm: number;
    splitRatio: number;
    toothWidthMm: number;
    toothTipHeightMm: number;
    slotOpeningMm: number;
    slotDepthMm: number;
    slotTopWidthMm: number;
    slotBottomWidthMm: number;
    slotAreaMm2: number;
    statorYokeHeightMm: number;
    rotorYokeHeightMm: number;
    endWindingOverhangMm: number;
    meanTurnLengthMm: number;
    carterCoefficient: number;
  };
  airgapFluxDensityT: number;
  airgapFluxDensityFundamentalT: number;
  toothFluxDensityT: number;
  yokeFluxDensityT: number;
  ratedTorqueNm: number;
  electromagneticTorqueNm: number;
  ratedCurrentA: number;
  dcLinkCurrentA: number;
  currentDensityAPerMm2: number;
  electricLoadingAPerM: number;
  conductor: { areaMm2: number; strandsInHand: number; strandDiameterMm: number; netSlotFill: number; grossSlotFill: number };
  dcBusV: number;
  electricalFrequencyHz: number;
  voltageUtilisationPct: number;
  backEmfConstantVsPerRad: number;
  lineBackEmfConstantVsPerRad: number;
  torqueConstantNmPerA: number;
  torqueConstantNmPerDcA: number;
  torqueRipplePct: number;
  phaseResistanceOhm: number;
  phaseInductanceH: number;
  mutualInductanceH: number;
  inductances: { airgapSelfH: number; slotLeakageSelfH: number; endWindingH: number; airgapMutualH: number; slotLeakageMutualH: number };
  losses: {
    copperW: number;
    ironW: number;
    ironHysteresisW: number;
    ironEddyW: number;
    ironTeethW: number;
    ironYokeW: number;
    magnetW: number;
    mechanicalW: number;
    frictionW: number;
    windageW: number;
    driveW: number;
    motorW: number;
  };
  motorInputPowerW: number;
  supplyInputPowerW: number;
  efficiencyPct: number;
  systemEfficiencyPct: number;
  supplyPowerFactor: number;
  massKg: { copper: number; statorSteel: number; rotorSteel: number; steel: number; magnet: number; total: number };
  volumesM3: { copper: number; statorSteel: number; rotorSteel: number; magnet: number };
  densitiesKgPerM3: { copper: number; steel: number; magnet: number };
  powerDensityKwPerKg: number;
  torquePerRotorVolumeKnmPerM3: number;
  shearStressKpa: number;
  activeMaterialCost: number;
  costBreakdown: { copper: number; steel: number; magnet: number };
  demagnetisationMarginPct: number;
  demagnetisation: DemagnetisationResult & { peakCurrentA: number; peakMmfA: number };
  coggingPeriodsPerRevolution: number;
  inertiaKgM2: number;
  simulationParams: BldcSimulationParams;
  lossModel: BldcLossModel;
  partLoadCurve: PartLoadCurve;
  waveforms?: {
    electricalAngleDeg: number[];
    airgapFluxDensityT: number[];
    phaseBackEmfV: { a: number[]; b: number[]; c: number[] };
    lineBackEmfV: number[];
  };
}

/** A candidate whose geometry cannot be built: the one constraint that stopped it. */
export interface RejectedCandidate {
  feasible: false;
  rejected: true;
  limitingConstraint: string;
  constraints: Constraint[];
}

function constraint(name: string, value: number, limit: number, unit: string, sense: 'max' | 'min'): Constraint {
  const safeValue = Number.isFinite(value) ? value : sense === 'max' ? Number.MAX_VALUE : 0;
  const utilisation = sense === 'max' ? safeValue / limit : safeValue > 0 ? limit / safeValue : Number.MAX_VALUE;
  return { name, value: safeValue, limit, unit, sense, satisfied: utilisation <= 1 + 1e-9, utilisation };
}

function reject(c: Constraint): RejectedCandidate {
  return { feasible: false, rejected: true, limitingConstraint: c.name, constraints: [c] };
}

// Local copies: imported bindings are read through accessors in some module loaders (hot loops).
const SAMPLES = WAVEFORM_SAMPLES;
const COS = COS_TABLE;

/** Peak of Σ a_n·cos(nθ) (n odd) over one period (half a period suffices by half-wave symmetry). */
function seriesPeak(amplitudes: readonly number[]): number {
  let peak = 0;
  const count = amplitudes.length;
  const half = SAMPLES / 2;
  for (let k = 0; k < half; k += 1) {
    let s = 0;
    for (let i = 0; i < count; i += 1) s += (amplitudes[i] as number) * ((COS[i] as number[])[k] as number);
    if (Math.abs(s) > peak) peak = Math.abs(s);
  }
  return peak;
}

const KW = 1000;

/** The magnetic design of one slot/pole combination at one split ratio and outer diameter. */
export interface MagneticDesign {
  D: number;
  R: number;
  g: number;
  slotPitch: number;
  bo: number;
  kc: number;
  lm: number;
  bg: number;
  Rm: number;
  Rr: number;
  fieldHarmonics: number[];
  toothFlux: number[];
  yokeFlux: number[];
  toothFluxPeak: number;
  yokeFluxPeak: number;
  wt: number;
  hy: number;
  hry: number;
  htip: number;
  slot: ReturnType<typeof slotGeometry>;
  copperAreaPerSlot: number;
  unitEmfs: number[][];
  kt: ReturnType<typeof torqueConstants>;
  end: ReturnType<typeof endWinding>;
}

/**
 * Steps 2–4 of the design for one split ratio and outer diameter: air gap, magnet from the load
 * line with Carter's coefficient, field harmonics, tooth and yoke, slot, EMF and torque constants.
 * Shared by every stack choice of the candidate.
 * @param spec request; @param analysis winding; @param splitRatio D/D_o [-]; @param outerDiameterM D_o [m]
 */
export function magneticDesign(spec: BldcSpec, analysis: WindingAnalysis, splitRatio: number, outerDiameterM: number): MagneticDesign | RejectedCandidate {
  const { targets, magnet, steel } = spec;
  const layout = analysis.layout;
  const Q = layout.slots;
  const p = layout.poles / 2;
  const kfe = steel.stackingFactor;
  const Do = outerDiameterM;
  const D = splitRatio * Do;
  const R = D / 2;
  const g = airgapLength(D, targets.airgapMm);
  const slotPitch = (Math.PI * D) / Q;
  const bo = slotOpening(slotPitch);
  if (bo >= 0.8 * slotPitch) return reject(constraint('slot pitch', slotPitch * 1000, (bo / 0.8) * 1000, 'mm', 'min'));

  // Magnet from the load line; Carter's coefficient on the magnetic gap g + l_m/μ_rec (§7).
  const hot = magnetAtTemperature(magnet, targets.magnetTemperatureC);
  const bgTarget = Math.min(targets.airgapFluxDensityT, 0.85 * MAGNET_LEAKAGE_FACTOR * hot.remanenceT);
  let lm = 3 * g;
  let kc = 1;
  for (let i = 0; i < 5; i += 1) {
    kc = carterCoefficient(slotPitch, bo, g + lm / magnet.recoilPermeability);
    lm = magnetThicknessFor(bgTarget, hot.remanenceT, magnet.recoilPermeability, kc, g, MAGNET_LEAKAGE_FACTOR);
  }
  lm = Math.max(lm, MIN_MAGNET_THICKNESS_M);
  const bg = loadLineFluxDensity(hot.remanenceT, lm, magnet.recoilPermeability, kc, g, MAGNET_LEAKAGE_FACTOR);
  const Rm = R - g;
  const Rr = Rm - lm;
  if (lm > MAX_MAGNET_THICKNESS_FRACTION * Rm) return reject(constraint('magnet thickness', lm * 1000, MAX_MAGNET_THICKNESS_FRACTION * Rm * 1000, 'mm', 'max'));
  const RsEff = Rm + kc * g;
  const fieldHarmonics = radialFieldHarmonics(p, hot.remanenceT, magnet.recoilPermeability, targets.poleArcFraction, Rr, Rm, RsEff);

  // Peak tooth and yoke flux per metre of stack from the field harmonics (Pyrhönen §6.2).
  const toothFlux = fieldHarmonics.map((b, i) => (R * b * 2 * Math.sin(((2 * i + 1) * p * Math.PI) / Q)) / ((2 * i + 1) * p));
  const yokeFlux = fieldHarmonics.map((b, i) => (R * b) / ((2 * i + 1) * p));
  const toothFluxPeak = seriesPeak(toothFlux);
  const yokeFluxPeak = seriesPeak(yokeFlux);
  const wt = Math.max(toothFluxPeak / (kfe * targets.toothFluxDensityT), MIN_TOOTH_WIDTH_M);
  const hy = yokeFluxPeak / (kfe * targets.yokeFluxDensityT);
  const hry = yokeFluxPeak / (kfe * ROTOR_YOKE_FLUX_DENSITY_T);
  const htip = toothTipHeight(D);
  const slot = slotGeometry(Do, D, Q, wt, hy, htip);
  if (slot.topWidthM < MIN_SLOT_WIDTH_M) return reject(constraint('slot width', slot.topWidthM * 1000, MIN_SLOT_WIDTH_M * 1000, 'mm', 'min'));
  if (slot.depthM < 2 * MIN_SLOT_WIDTH_M) return reject(constraint('slot depth', slot.depthM * 1000, 2 * MIN_SLOT_WIDTH_M * 1000, 'mm', 'min'));
  const copperAreaPerSlot = targets.slotFill * slot.areaM2;

  const unitEmfs = unitPhaseEmfs(analysis, fieldHarmonics, R);
  const kt = torqueConstants(unitEmfs, spec.drive);
  if (!(kt.perRmsAmpere > 0)) return reject(constraint('torque constant', 0, 1, '-', 'min'));

  const midSlotPitch = (2 * Math.PI * (R + htip + slot.depthM / 2)) / Q;
  const end = endWinding(layout.coilPitch, midSlotPitch, wt, (slot.topWidthM + slot.bottomWidthM) / 2);
  return { D, R, g, slotPitch, bo, kc, lm, bg, Rm, Rr, fieldHarmonics, toothFlux, yokeFlux, toothFluxPeak, yokeFluxPeak, wt, hy, hry, htip, slot, copperAreaPerSlot, unitEmfs, kt, end };
}

/**
 * Evaluates one candidate design.
 * @param spec resolved request (power [W], speed [rpm], DC bus [V], materials, targets, frame)
 * @param analysis winding analysis of the slot/pole combination
 * @param candidate split ratio [-], outer diameter [m], stack choice
 * @param withWaveforms include the waveforms for output
 * @param ranking skip what only the chosen design needs (part-load curve, EMF shape)
 * @param prepared the candidate's magnetic design when already computed (shared by stack choices)
 * @returns the design with its constraints, or the constraint that stopped it
 */
export function evaluateDesign(spec: BldcSpec, analysis: WindingAnalysis, candidate: Candidate, withWaveforms = false, ranking = false, prepared?: MagneticDesign): BldcDesign | RejectedCandidate {
  const { targets, magnet, steel } = spec;
  const layout = analysis.layout;
  const Q = layout.slots;
  const p = layout.poles / 2;
  const omega = (2 * Math.PI * spec.speedRpm) / 60;
  const torque = spec.ratedPowerW / omega; // T = P/ω
  const fe = (p * spec.speedRpm) / 60;
  const kfe = steel.stackingFactor;
  const Do = candidate.outerDiameterM;
  const m = prepared ?? magneticDesign(spec, analysis, candidate.splitRatio, Do);
  if ('rejected' in m) return m;
  const { D, R, g, bo, kc, lm, bg, Rm, Rr, fieldHarmonics, toothFlux, yokeFlux, toothFluxPeak, yokeFluxPeak, wt, hy, hry, htip, slot, copperAreaPerSlot, unitEmfs, kt, end } = m;
  const rho = copperResistivity(targets.windingTemperatureC);
  const jTarget = targets.currentDensityAPerMm2 * 1e6;
  const tauP = (Math.PI * D) / (2 * p);
  const vSurface = omega * Rm;

  // Stack/current-density loop: T_em = T + (P_fe + P_mag + P_mech)/ω (losses as drag).
  let tem = torque * 1.02;
  let L = 0;
  let J = 0;
  let ampereTurns = 0;
  let ironTeeth = { hysteresisW: 0, eddyW: 0 };
  let ironYoke = { hysteresisW: 0, eddyW: 0 };
  let magnetW = 0;
  let mechanicalW = 0;
  let teethMass = 0;
  let yokeMass = 0;
  const toothB = toothFlux.map((f) => f / (kfe * wt));
  const yokeB = yokeFlux.map((f) => f / (kfe * hy));
  const toothBPeak = toothFluxPeak / (kfe * wt);
  const yokeBPeak = yokeFluxPeak / (kfe * hy);
  const r1 = R + htip;
  const teethArea = Q * wt * slot.depthM + (Math.PI * (r1 * r1 - R * R) - Q * bo * htip);
  const yokeArea = Math.PI * ((Do / 2) ** 2 - (Do / 2 - hy) ** 2);
  const magnetArea = targets.poleArcFraction * Math.PI * (Rm * Rm - Rr * Rr);
  const effectiveGap = kc * g + lm / magnet.recoilPermeability;
  for (let iteration = 0; iteration < 4; iteration += 1) {
    // T_em = K·L·(N·I), N·I = Q·J·A_cu/6 (RMS ampere-turns of one phase).
    if (candidate.stack.kind === 'length') {
      L = candidate.stack.lengthM;
      ampereTurns = tem / (kt.perRmsAmpere * L);
      J = (6 * ampereTurns) / (Q * copperAreaPerSlot);
    } else {
      J = jTarget * candidate.stack.fraction;
      ampereTurns = (Q * J * copperAreaPerSlot) / 6;
      L = tem / (kt.perRmsAmpere * ampereTurns);
    }
    teethMass = teethArea * L * kfe * steel.densityKgPerM3;
    yokeMass = yokeArea * L * kfe * steel.densityKgPerM3;
    ironTeeth = regionIronLoss(steel, teethMass, fe, toothBPeak, toothB);
    ironYoke = regionIronLoss(steel, yokeMass, fe, yokeBPeak, yokeB);
    magnetW = magnetEddyLoss({
      analysis,
      seriesTurns: 1,
      rmsCurrentA: ampereTurns,
      electricalFrequencyHz: fe,
      effectiveGapM: effectiveGap,
      magnetRadiusM: Rm,
      statorRadiusM: R,
      magnetWidthM: targets.poleArcFraction * tauP * (Rm / R),
      stackLengthM: L,
      magnetVolumeM3: magnetArea * L,
      conductivitySPerM: magnet.conductivitySPerM,
      recoilPermeability: magnet.recoilPermeability,
    });
    mechanicalW = frictionAndWindage(2 * Rm, L, tauP, vSurface, spec.cooling);
    const ironW = ironTeeth.hysteresisW + ironTeeth.eddyW + ironYoke.hysteresisW + ironYoke.eddyW;
    tem = torque + (ironW + magnetW + mechanicalW) / omega;
  }
  const ironW = ironTeeth.hysteresisW + ironTeeth.eddyW + ironYoke.hysteresisW + ironYoke.eddyW;

  const meanTurnLength = 2 * L + 2 * end.lengthM;
  const slotWidthMean = (slot.topWidthM + slot.bottomWidthM) / 2;
  const slotPermeance = slot.depthM / (3 * slotWidthMean) + htip / bo; // λ_u of Pyrhönen §4.2
  const ind = inductancesPerTurn(analysis, R, L, effectiveGap, slotPermeance, end.lengthM, END_WINDING_PERMEANCE_FACTOR);
  const sixStep = spec.drive === 'six-step';
  const dcPerRms = sixStep ? 1 / Math.sqrt(2 / 3) : Math.SQRT2;
  const available = spec.dcBusV * (1 - targets.voltageMarginPct / 100);

  // Volts needed per series turn (all terms ∝ N at fixed N·I and J).
  const lineEmfPerTurn = peakLineEmf(unitEmfs) * omega * L;
  let perTurn: number;
  if (sixStep) {
    perTurn = lineEmfPerTurn + 2 * rho * meanTurnLength * J * dcPerRms; // V_dc ≥ ê_LL + 2·R·I_dc
  } else {
    const e1 = (kt.perRmsAmpere / 3) * omega * L; // E_1,rms per turn
    const ri = rho * meanTurnLength * J;
    const xi = 2 * Math.PI * fe * (ind.self - ind.mutual) * ampereTurns;
    perTurn = Math.sqrt(6) * Math.hypot(e1 + ri, xi); // phase RMS ≤ V_dc/√6 (SVPWM linear limit)
  }
  const targetTurns = available / perTurn;
  const cpp = layout.coilsPerPhase;
  let best = { a: 1, nc: 0, n: 0 };
  for (let a = 1; a <= layout.maxParallelPaths; a += 1) {
    if (cpp % a !== 0) continue;
    const nc = Math.floor((targetTurns * a) / cpp + 1e-9);
    const n = (cpp * nc) / a;
    if (nc >= 1 && n > best.n + 1e-9) best = { a, nc, n };
  }
  if (best.nc === 0) {
    const a = [...Array(layout.maxParallelPaths).keys()].map((i) => i + 1).filter((x) => cpp % x === 0).pop() ?? 1;
    best = { a, nc: 1, n: cpp / a };
  }
  const N = best.n;
  const parallelPaths = best.a;
  const voltageNeeded = N * perTurn;
  const rmsCurrent = ampereTurns / N;
  const dcCurrent = rmsCurrent * (sixStep ? dcPerRms : 1);
  const conductorArea = rmsCurrent / (parallelPaths * J);
  const strandArea = (Math.PI / 4) * MAX_STRAND_DIAMETER_M ** 2;
  const strands = Math.max(1, Math.ceil(conductorArea / strandArea - 1e-9));
  const strandDiameter = Math.sqrt((4 * conductorArea) / (Math.PI * strands));
  const grossFill = targets.slotFill * ((strandDiameter + ENAMEL_BUILD_M) / strandDiameter) ** 2;
  const resistance = phaseResistance(rho, N, meanTurnLength, parallelPaths, conductorArea);
  const copperW = 3 * resistance * rmsCurrent * rmsCurrent;
  const selfL = ind.self * N * N;
  const mutualL = ind.mutual * N * N;

  let emfPeak = 0;
  for (const v of unitEmfs[0] ?? []) emfPeak = Math.max(emfPeak, Math.abs(v));
  const ke = emfPeak * N * L; // phase EMF peak per rad/s
  const keLine = peakLineEmf(unitEmfs) * N * L;
  const ktRms = kt.perRmsAmpere * N * L;
  const ktDc = kt.perDcAmpere * N * L;

  const ratedDrive = driveLossModel(spec.ratedPowerW, rmsCurrent, spec.dcBusV);
  const driveW = driveLossW(ratedDrive, rmsCurrent);
  const frictionW = FRICTION_SHARE * mechanicalW;
  const windageW = mechanicalW - frictionW;
  const motorLosses = copperW + ironW + magnetW + mechanicalW;
  const motorInput = spec.ratedPowerW + motorLosses;
  const supplyInput = motorInput + driveW;
  const efficiency = spec.ratedPowerW / motorInput;
  const systemEfficiency = spec.ratedPowerW / supplyInput;

  // Peak current and demagnetisation (drive current limit, opposing MMF; Hanselman ch. 4).
  const peakCurrent = targets.currentLimitFactor * (sixStep ? dcCurrent : Math.SQRT2 * rmsCurrent);
  const turnsPerCoilPerPath = N / cpp;
  const peakMmf = Math.max(
    peakArmatureMmf(analysis, turnsPerCoilPerPath, [peakCurrent, -peakCurrent, 0]),
    peakArmatureMmf(analysis, turnsPerCoilPerPath, [peakCurrent, -peakCurrent / 2, -peakCurrent / 2]),
  );
  const demag = demagnetisationMargin(magnet, targets.magnetTemperatureC, lm, kc * g, peakMmf);

  // Masses = volume × density.
  const shaftD = Math.min(shaftDiameter(targets.currentLimitFactor * torque), 2 * Rr * 0.9);
  const rsh = shaftD / 2;
  const copperVolume = 3 * parallelPaths * N * conductorArea * meanTurnLength;
  const statorVolume = (teethArea + yokeArea) * L * kfe;
  const rotorVolume = Math.max(0, Math.PI * (Rr * Rr - rsh * rsh) * L * kfe);
  const magnetVolume = magnetArea * L;
  const mCopper = copperVolume * COPPER_DENSITY;
  const mStator = statorVolume * steel.densityKgPerM3;
  const mRotor = rotorVolume * steel.densityKgPerM3;
  const mMagnet = magnetVolume * magnet.densityKgPerM3;
  const mTotal = mCopper + mStator + mRotor + mMagnet;
  const costCopper = mCopper * COPPER_PRICE_PER_KG;
  const costSteel = (mStator + mRotor) * steel.pricePerKg;
  const costMagnet = mMagnet * magnet.pricePerKg;
  const cost = costCopper + costSteel + costMagnet;
  const inertia = 0.5 * mRotor * (Rr * Rr + rsh * rsh) + 0.5 * mMagnet * (Rm * Rm + Rr * Rr) + 0.5 * (Math.PI * rsh * rsh * L * SHAFT_STEEL_DENSITY) * rsh * rsh;

  // Rotor volume at the air-gap (bore) diameter, V_r = π·D²·L/4, as in T = 2·σ·V_r (Pyrhönen §6.1).
  const rotorVolumeEnvelope = Math.PI * R * R * L;
  const trv = torque / rotorVolumeEnvelope;

  const constraints: Constraint[] = [
    constraint('stator outer diameter', Do * 1000, spec.frame.maxStatorOuterDiameterMm, 'mm', 'max'),
    constraint('stack length', L * 1000, spec.frame.maxStackLengthMm, 'mm', 'max'),
    constraint('current density', J / 1e6, targets.currentDensityAPerMm2, 'A/mm²', 'max'),
    constraint('voltage', voltageNeeded, available, 'V', 'max'),
    constraint('demagnetisation margin', demag.marginPct, targets.minDemagnetisationMarginPct, '%', 'min'),
    constraint('slot fill', grossFill, MAX_GROSS_SLOT_FILL, '-', 'max'),
    constraint('tooth flux density', targets.toothFluxDensityT, steel.saturationT, 'T', 'max'),
    constraint('yoke flux density', targets.yokeFluxDensityT, steel.saturationT, 'T', 'max'),
    constraint('magnet thickness', lm * 1000, MIN_MAGNET_THICKNESS_M * 1000, 'mm', 'min'),
    constraint('rotor core', (Rr - rsh) * 1000, hry * 1000, 'mm', 'min'),
    constraint('magnet temperature', targets.magnetTemperatureC, magnet.maxTemperatureC, '°C', 'max'),
    constraint('surface speed', vSurface, MAX_SURFACE_SPEED_M_PER_S, 'm/s', 'max'),
    constraint('electrical frequency', fe, MAX_ELECTRICAL_FREQUENCY_HZ, 'Hz', 'max'),
    constraint('torque per rotor volume', trv / KW, MAX_TORQUE_PER_ROTOR_VOLUME_KNM_PER_M3[spec.cooling], 'kN·m/m³', 'max'),
  ];
  if (spec.minEfficiencyPct !== undefined) constraints.push(constraint('efficiency', efficiency * 100, spec.minEfficiencyPct, '%', 'min'));
  const violated = constraints.filter((c) => !c.satisfied);
  const feasible = violated.length === 0;
  // A feasible design fills the frame's diameter by construction: name the next closest limit.
  const pool = feasible ? constraints.filter((c) => c.name !== 'stator outer diameter') : violated;
  const limiting = pool.reduce((a, b) => (b.utilisation > a.utilisation ? b : a));

  const objectiveValue = spec.objective === 'cost' ? cost : spec.objective === 'mass' ? mTotal : -systemEfficiency;

  const lossModel: BldcLossModel = {
    ratedSpeedRpm: spec.speedRpm,
    ratedTorqueNm: torque,
    maxSpeedRpm: Math.min(spec.speedRpm * (available / Math.max(lineEmfPerTurn * N, 1e-9)), (MAX_SURFACE_SPEED_M_PER_S / Rm) * (60 / (2 * Math.PI))),
    maxContinuousTorqueNm: torque,
    peakTorqueNm: (sixStep ? ktDc : ktRms / Math.SQRT2) * peakCurrent,
    dcBusV: spec.dcBusV,
    polePairs: p,
    phaseResistanceOhm: resistance,
    torqueConstantNmPerA: ktRms,
    backEmfConstantVsPerRad: ke,
    ironHysteresisAtRatedW: ironTeeth.hysteresisW + ironYoke.hysteresisW,
    ironEddyAtRatedW: ironTeeth.eddyW + ironYoke.eddyW,
    magnetEddyAtRatedW: magnetW,
    frictionAtRatedW: frictionW,
    windageAtRatedW: windageW,
    drive: ratedDrive,
  };

  const emfShape = ranking ? [] : (unitEmfs[0] ?? []).map((v) => (v * N * L) / Math.max(ke, 1e-12));
  const flatTop = (emfShape.filter((v) => v >= 0.95).length * 360) / WAVEFORM_SAMPLES;
  const simulationParams: BldcSimulationParams = {
    phaseResistanceOhm: resistance,
    phaseInductanceH: selfL,
    mutualInductanceH: mutualL,
    backEmfConstantVsPerRad: ke,
    flatTopElectricalDeg: flatTop,
    polePairs: p,
    inertiaKgM2: inertia,
    viscousFrictionNmsPerRad: mechanicalW / (omega * omega),
    dcBusV: spec.dcBusV,
    backEmfShape: emfShape,
  };

  const partLoadCurve = ranking ? { source: '', ratedPowerKw: 0, points: [] } : partLoad(spec, lossModel, ratedDrive, `BLDC design ${Q} slots / ${2 * p} poles, ${Math.round(L * 1000)} mm stack`);

  const design: BldcDesign = {
    feasible,
    limitingConstraint: limiting.name,
    constraints,
    objectiveValue,
    slots: Q,
    poles: 2 * p,
    layers: layout.layers,
    coilPitch: layout.coilPitch,
    windingFactor: layout.windingFactor,
    turnsPerPhase: N,
    turnsPerCoil: best.nc,
    parallelPaths,
    geometry: {
      statorOuterDiameterMm: Do * 1000,
      boreDiameterMm: D * 1000,
      stackLengthMm: L * 1000,
      airgapMm: g * 1000,
      magnetThicknessMm: lm * 1000,
      magnetArcFraction: targets.poleArcFraction,
      rotorOuterDiameterMm: 2 * Rm * 1000,
      rotorCoreDiameterMm: 2 * Rr * 1000,
      shaftDiameterMm: shaftD * 1000,
      splitRatio: candidate.splitRatio,
      toothWidthMm: wt * 1000,
      toothTipHeightMm: htip * 1000,
      slotOpeningMm: bo * 1000,
      slotDepthMm: slot.depthM * 1000,
      slotTopWidthMm: slot.topWidthM * 1000,
      slotBottomWidthMm: slot.bottomWidthM * 1000,
      slotAreaMm2: slot.areaM2 * 1e6,
      statorYokeHeightMm: hy * 1000,
      rotorYokeHeightMm: hry * 1000,
      endWindingOverhangMm: end.overhangM * 1000,
      meanTurnLengthMm: meanTurnLength * 1000,
      carterCoefficient: kc,
    },
    airgapFluxDensityT: bg,
    airgapFluxDensityFundamentalT: fieldHarmonics[0] ?? 0,
    toothFluxDensityT: toothBPeak,
    yokeFluxDensityT: yokeBPeak,
    ratedTorqueNm: torque,
    electromagneticTorqueNm: tem,
    ratedCurrentA: rmsCurrent,
    dcLinkCurrentA: dcCurrent,
    currentDensityAPerMm2: J / 1e6,
    electricLoadingAPerM: (6 * ampereTurns) / (Math.PI * D),
    conductor: { areaMm2: conductorArea * 1e6, strandsInHand: strands, strandDiameterMm: strandDiameter * 1000, netSlotFill: targets.slotFill, grossSlotFill: grossFill },
    dcBusV: spec.dcBusV,
    electricalFrequencyHz: fe,
    voltageUtilisationPct: (voltageNeeded / spec.dcBusV) * 100,
    backEmfConstantVsPerRad: ke,
    lineBackEmfConstantVsPerRad: keLine,
    torqueConstantNmPerA: ktRms,
    torqueConstantNmPerDcA: ktDc,
    torqueRipplePct: kt.ripple * 100,
    phaseResistanceOhm: resistance,
    phaseInductanceH: selfL,
    mutualInductanceH: mutualL,
    inductances: {
      airgapSelfH: ind.airgapSelf * N * N,
      slotLeakageSelfH: ind.slotSelf * N * N,
      endWindingH: ind.endWinding * N * N,
      airgapMutualH: ind.airgapMutual * N * N,
      slotLeakageMutualH: ind.slotMutual * N * N,
    },
    losses: {
      copperW,
      ironW,
      ironHysteresisW: ironTeeth.hysteresisW + ironYoke.hysteresisW,
      ironEddyW: ironTeeth.eddyW + ironYoke.eddyW,
      ironTeethW: ironTeeth.hysteresisW + ironTeeth.eddyW,
      ironYokeW: ironYoke.hysteresisW + ironYoke.eddyW,
      magnetW,
      mechanicalW,
      frictionW,
      windageW,
      driveW,
      motorW: motorLosses,
    },
    motorInputPowerW: motorInput,
    supplyInputPowerW: supplyInput,
    efficiencyPct: efficiency * 100,
    systemEfficiencyPct: systemEfficiency * 100,
    supplyPowerFactor: driveInputPowerFactor(1),
    massKg: { copper: mCopper, statorSteel: mStator, rotorSteel: mRotor, steel: mStator + mRotor, magnet: mMagnet, total: mTotal },
    volumesM3: { copper: copperVolume, statorSteel: statorVolume, rotorSteel: rotorVolume, magnet: magnetVolume },
    densitiesKgPerM3: { copper: COPPER_DENSITY, steel: steel.densityKgPerM3, magnet: magnet.densityKgPerM3 },
    powerDensityKwPerKg: spec.ratedPowerW / KW / mTotal,
    torquePerRotorVolumeKnmPerM3: trv / KW,
    shearStressKpa: trv / 2 / KW,
    activeMaterialCost: cost,
    costBreakdown: { copper: costCopper, steel: costSteel, magnet: costMagnet },
    demagnetisationMarginPct: demag.marginPct,
    demagnetisation: { ...demag, peakCurrentA: peakCurrent, peakMmfA: peakMmf },
    coggingPeriodsPerRevolution: layout.coggingPeriodsPerRevolution,
    inertiaKgM2: inertia,
    simulationParams,
    lossModel,
    partLoadCurve,
  };
  if (withWaveforms) {
    const angles = Array.from({ length: WAVEFORM_SAMPLES }, (_, k) => (k * 360) / WAVEFORM_SAMPLES);
    const air = angles.map((deg) => {
      // Field in rotor coordinates, d-axis at 90° to line up with phase A's EMF peak.
      const theta = ((deg - 90) * Math.PI) / 180;
      return fieldHarmonics.reduce((s, b, i) => s + b * Math.cos((2 * i + 1) * theta), 0);
    });
    const scale = omega * N * L;
    const [ea = [], eb = [], ec = []] = unitEmfs.map((w) => w.map((v) => v * scale));
    design.waveforms = {
      electricalAngleDeg: angles,
      airgapFluxDensityT: air,
      phaseBackEmfV: { a: ea, b: eb, c: ec },
      lineBackEmfV: ea.map((v, k) => v - (eb[k] ?? 0)),
    };
  }
  return design;
}

/**
 * Losses at speed n and torque T from a loss model, as the contract's consumer scales them:
 * hysteresis ∝ n, eddy ∝ n², magnet ∝ n²·(T/T_rated)², friction ∝ n, windage ∝ n³; copper
 * 3·R·I² with I = (T + T_drag)/k_t; drive three-term in I.
 * @param model loss model; @param speedRpm [rpm]; @param torqueNm shaft torque [N·m]
 * @returns losses [W] and the RMS current [A]
 */
export function lossesAt(model: BldcLossModel, speedRpm: number, torqueNm: number): { motorW: number; driveW: number; currentA: number } {
  const s = speedRpm / model.ratedSpeedRpm;
  const omega = (2 * Math.PI * speedRpm) / 60;
  const tr = torqueNm / model.ratedTorqueNm;
  const iron = model.ironHysteresisAtRatedW * s + model.ironEddyAtRatedW * s * s;
  const mech = model.frictionAtRatedW * s + model.windageAtRatedW * s ** 3;
  const magnet = model.magnetEddyAtRatedW * s * s * tr * tr;
  const drag = omega > 0 ? (iron + mech + magnet) / omega : 0;
  const current = (torqueNm + drag) / model.torqueConstantNmPerA;
  const copper = 3 * model.phaseResistanceOhm * current * current;
  return { motorW: iron + mech + magnet + copper, driveW: driveLossW(model.drive, current), currentA: current };
}

/**
 * Part-load curve at rated speed, torque = load × rated (contract PartLoadCurve): efficiency of
 * motor and drive together and the supply power factor (drive.ts), 10 % to 125 % load.
 * @param spec request; @param model loss model; @param drive drive loss model; @param source label
 */
export function partLoad(spec: BldcSpec, model: BldcLossModel, drive: DriveLossModel, source: string): PartLoadCurve {
  const points = PART_LOAD_FRACTIONS.map((loadFraction) => {
    const out = spec.ratedPowerW * loadFraction;
    const l = lossesAt({ ...model, drive }, spec.speedRpm, model.ratedTorqueNm * loadFraction);
    const input = out + l.motorW + l.driveW;
    return { loadFraction, efficiency: out / input, powerFactor: driveInputPowerFactor(loadFraction) };
  });
  return { source, ratedPowerKw: spec.ratedPowerW / KW, points };
}

export { FIELD_HARMONIC_COUNT };
