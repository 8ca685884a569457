/**
 * Electrical quantities of a surface-PM winding: back-EMF waveforms, torque constants, winding
 * functions, inductances (air gap, slot leakage, end winding, mutual) and resistance.
 *
 * References:
 * [1] J. Pyrhönen, T. Jokinen, V. Hrabovcová, Design of Rotating Electrical Machines, 2nd ed., 2014:
 *     §2 (EMF, winding factors), §4.2–4.3 (slot and end-winding leakage: L_u = (4m/Q)·μ0·l·N²·λ_u,
 *     λ_u = h/(3b) + h_4/b_1; L_w = (4m/Q)·q·μ0·N²·l_w·λ_w).
 * [2] D. Hanselman, Brushless Permanent Magnet Motor Design, 2nd ed., 2006, ch. 5–6 (e = B·l·v summed
 *     over coil sides; six-step torque T = Σ e·i / ω; K_e = K_t in SI units).
 * [3] N. L. Schmitz, D. W. Novotny, Introductory Electromechanics, 1965 — winding-function
 *     inductances L = μ0·r·l/g·∫N_a·N_b dφ (in the form used by Hendershot and Miller, Design of
 *     Brushless Permanent-Magnet Machines, ch. 5).
 * [4] IEC 60028: resistivity of annealed copper, 1/58 Ω·mm²/m at 20 °C, 0.00393/K.
 */
import { COPPER_RESISTIVITY_20C, COPPER_TEMP_COEFF } from './defaults.js';
import { FIELD_HARMONIC_COUNT } from './airgap.js';
import { phaseWindingPhasor, type PhaseName, type WindingLayout } from './winding.js';

const MU0 = 4e-7 * Math.PI;
/** Samples of a waveform over one electrical period [-]. */
export const WAVEFORM_SAMPLES = 180;
const PHASES: PhaseName[] = ['A', 'B', 'C'];
const HARMONICS = FIELD_HARMONIC_COUNT;

/** cos(n·θ_k) for odd n (index i → n = 2i+1) on the waveform grid. */
export const COS_TABLE: number[][] = [];
const SIN_TABLE: number[][] = [];
for (let i = 0; i < FIELD_HARMONIC_COUNT; i += 1) {
  const n = 2 * i + 1;
  const c: number[] = [];
  const s: number[] = [];
  for (let k = 0; k < WAVEFORM_SAMPLES; k += 1) {
    const theta = (2 * Math.PI * n * k) / WAVEFORM_SAMPLES;
    c.push(Math.cos(theta));
    s.push(Math.sin(theta));
  }
  COS_TABLE.push(c);
  SIN_TABLE.push(s);
}

/** What the design needs from a winding, computed once per slot/pole combination. */
export interface WindingAnalysis {
  layout: WindingLayout;
  /** ξ_k(n·p) of phases A, B, C for odd n, rotated so that phase A's EMF fundamental is sin(θ_e). */
  emfPhasors: Array<Array<[number, number]>>;
  /** Signed coil sides of each phase in each slot, for one turn per coil [-]. */
  slotTurns: number[][];
  /** Winding function of each phase over each slot interval, one turn per coil [-]. */
  windingFunction: number[][];
  /** Forward and backward armature MMF harmonics per unit (|Σ_k ξ_k(ν)·e^{±j2πk/3}|/2) [-]. */
  mmfHarmonics: Array<{ mechanicalOrder: number; amplitude: number; synchronousDirection: boolean }>;
}

/**
 * Prepares a winding for the design: EMF phasors per field harmonic, slot conductor counts,
 * winding functions and MMF harmonics with their direction of travel.
 * @param layout a winding from windingLayout
 */
export function analyseWinding(layout: WindingLayout): WindingAnalysis {
  const { slots, poles } = layout;
  const p = poles / 2;
  const byPhase = PHASES.map((phase) => layout.coils.filter((coil) => coil.phase === phase));
  const fundamentalA = phaseWindingPhasor(byPhase[0] ?? [], slots, p);
  // Rotation δ so that e_a = |E|·sin(θ_e): e ∝ Re{ξ·e^{−jθ}} peaks at θ = arg ξ; want the peak at 90°.
  const delta = Math.atan2(fundamentalA[1], fundamentalA[0]) - Math.PI / 2;
  const emfPhasors = byPhase.map((coils) => {
    const out: Array<[number, number]> = [];
    for (let i = 0; i < HARMONICS; i += 1) {
      const n = 2 * i + 1;
      const [re, im] = phaseWindingPhasor(coils, slots, n * p);
      const c = Math.cos(-n * delta);
      const s = Math.sin(-n * delta);
      out.push([re * c - im * s, re * s + im * c]);
    }
    return out;
  });
  const slotTurns = byPhase.map((coils) => {
    const turns = new Array<number>(slots).fill(0);
    for (const coil of coils) {
      turns[coil.goSlot] = (turns[coil.goSlot] ?? 0) + coil.direction;
      turns[coil.returnSlot] = (turns[coil.returnSlot] ?? 0) - coil.direction;
    }
    return turns;
  });
  const windingFunction = slotTurns.map((turns) => {
    let running = 0;
    const n = turns.map((t) => (running += t));
    const mean = n.reduce((a, b) => a + b, 0) / slots;
    return n.map((v) => v - mean);
  });
  const mmfHarmonics: WindingAnalysis['mmfHarmonics'] = [];
  const maxOrder = Math.min(slots * 2 + p, 12 * p + slots);
  let synchronousSign = 0;
  const components: Array<{ order: number; fwd: number; bwd: number }> = [];
  for (let order = 1; order <= maxOrder; order += 1) {
    const ph = byPhase.map((coils) => phaseWindingPhasor(coils, slots, order));
    let fr = 0;
    let fi = 0;
    let br = 0;
    let bi = 0;
    ph.forEach(([re, im], k) => {
      const a = (2 * Math.PI * k) / 3;
      fr += re * Math.cos(a) - im * Math.sin(a);
      fi += re * Math.sin(a) + im * Math.cos(a);
      br += re * Math.cos(a) + im * Math.sin(a);
      bi += im * Math.cos(a) - re * Math.sin(a);
    });
    const fwd = Math.hypot(fr, fi) / 2;
    const bwd = Math.hypot(br, bi) / 2;
    if (order === p) synchronousSign = fwd >= bwd ? 1 : -1;
    components.push({ order, fwd, bwd });
  }
  for (const { order, fwd, bwd } of components) {
    if (fwd > 1e-9) mmfHarmonics.push({ mechanicalOrder: order, amplitude: fwd, synchronousDirection: synchronousSign === 1 });
    if (bwd > 1e-9) mmfHarmonics.push({ mechanicalOrder: order, amplitude: bwd, synchronousDirection: synchronousSign === -1 });
  }
  return { layout, emfPhasors, slotTurns, windingFunction, mmfHarmonics };
}

/**
 * Phase back-EMF waveforms per unit: one series turn per phase, 1 m of stack, 1 rad/s.
 * e_k(θ_e) = 2·R·Σ_n B_n·Re{ξ_k,n·e^{−jnθ_e}} — the sum of B·l·v over the phase's coil sides ([2]),
 * whose fundamental is ω·N·k_w1·B̂_1·D·L ([1] §2).
 * @param analysis winding analysis
 * @param fieldHarmonics B_n at the bore for n = 1, 3, 5… [T]
 * @param boreRadiusM R [m]
 * @returns three arrays of WAVEFORM_SAMPLES values [V·s/(rad·m·turn)], phase A aligned to sin(θ_e)
 */
export function unitPhaseEmfs(analysis: WindingAnalysis, fieldHarmonics: readonly number[], boreRadiusM: number): number[][] {
  const samples = WAVEFORM_SAMPLES;
  return analysis.emfPhasors.map((phasors) => {
    const out = new Float64Array(samples);
    for (let i = 0; i < HARMONICS; i += 1) {
      const b = fieldHarmonics[i] ?? 0;
      const [re, im] = phasors[i] ?? [0, 0];
      if (Math.abs(b * Math.hypot(re, im)) < 1e-12) continue;
      const cos = COS_TABLE[i] as number[];
      const sin = SIN_TABLE[i] as number[];
      const a = 2 * boreRadiusM * b * re;
      const c = 2 * boreRadiusM * b * im;
      // Re{(re + j·im)(cos − j·sin)} = re·cos + im·sin
      for (let k = 0; k < samples; k += 1) out[k] = (out[k] as number) + a * (cos[k] as number) + c * (sin[k] as number);
    }
    return Array.from(out);
  });
}

/** Ideal six-step (120° conduction) current of phase k (0, 1, 2 lagging by 120°) at sample j, per DC ampere. */
export function sixStepCurrent(phaseIndex: number, sample: number): number {
  return SIX_STEP[phaseIndex]?.[sample] ?? 0;
}

function sixStepCurrentAt(phaseIndex: number, sample: number): number {
  const deg = ((((sample * 360) / WAVEFORM_SAMPLES - phaseIndex * 120) % 360) + 360) % 360;
  if (deg >= 30 - 1e-9 && deg < 150 - 1e-9) return 1;
  if (deg >= 210 - 1e-9 && deg < 330 - 1e-9) return -1;
  return 0;
}

const SIX_STEP: number[][] = [0, 1, 2].map((ph) => Array.from({ length: WAVEFORM_SAMPLES }, (_, k) => sixStepCurrentAt(ph, k)));

export interface TorqueConstants {
  /** Mean torque per DC-link (flat-top phase) ampere, per turn and per metre [N·m/(A·turn·m)]. */
  perDcAmpere: number;
  /** Mean torque per RMS phase ampere [N·m/(A·turn·m)]. */
  perRmsAmpere: number;
  /** Peak-to-peak torque ripple / mean with ideal currents [-]. */
  ripple: number;
}

/**
 * Torque constants from the EMF waveforms by energy conversion, T = Σ e_k·i_k/ω ([2] ch. 6):
 * six-step: mean over a period with ideal 120° currents; RMS phase current I_dc·√(2/3).
 * sinusoidal: T = 3·E_1,rms·I_rms/ω with current in phase with the EMF.
 * @param unitEmfs per-unit phase EMFs from unitPhaseEmfs
 * @param drive 'six-step' or 'sinusoidal'
 */
export function torqueConstants(unitEmfs: readonly number[][], drive: 'six-step' | 'sinusoidal'): TorqueConstants {
  if (drive === 'sinusoidal') {
    const a = unitEmfs[0] ?? [];
    let s = 0;
    let c = 0;
    a.forEach((v, k) => {
      s += v * Math.sin((2 * Math.PI * k) / WAVEFORM_SAMPLES);
      c += v * Math.cos((2 * Math.PI * k) / WAVEFORM_SAMPLES);
    });
    const e1 = (2 / WAVEFORM_SAMPLES) * Math.hypot(s, c);
    const perRms = (3 * e1) / Math.SQRT2;
    return { perDcAmpere: perRms * Math.sqrt(2 / 3), perRmsAmpere: perRms, ripple: 0 };
  }
  let sum = 0;
  let max = -Infinity;
  let min = Infinity;
  const samples = WAVEFORM_SAMPLES;
  for (let k = 0; k < samples; k += 1) {
    let t = 0;
    for (let ph = 0; ph < 3; ph += 1) t += ((unitEmfs[ph] as number[])[k] as number) * ((SIX_STEP[ph] as number[])[k] as number);
    sum += t;
    max = Math.max(max, t);
    min = Math.min(min, t);
  }
  const mean = sum / WAVEFORM_SAMPLES;
  return { perDcAmpere: mean, perRmsAmpere: mean / Math.sqrt(2 / 3), ripple: mean > 0 ? (max - min) / mean : 0 };
}

/** Largest |e_a − e_b| (line EMF) of per-unit waveforms. */
export function peakLineEmf(unitEmfs: readonly number[][]): number {
  let peak = 0;
  const a = unitEmfs[0] ?? [];
  const b = unitEmfs[1] ?? [];
  a.forEach((v, k) => {
    peak = Math.max(peak, Math.abs(v - (b[k] ?? 0)));
  });
  return peak;
}

export interface InductancesPerTurn {
  /** Self-inductance per (series turn per phase)² [H]. */
  self: number;
  /** Mutual inductance between two phases per turn² [H], ≤ 0 for the usual windings. */
  mutual: number;
  airgapSelf: number;
  airgapMutual: number;
  slotSelf: number;
  slotMutual: number;
  endWinding: number;
}

/**
 * Inductances of a phase per series turn squared (scale by N_ph²):
 * air gap from the winding functions, L_ab = μ0·R·L/g_eff·∫n_a·n_b dφ ([3]);
 * slot leakage L_ab = μ0·L·λ_u·Σ_slots c_a·c_b with λ_u = h_s/(3·b_s) + h_tip/b_o ([1] §4.2);
 * end winding L_w = (4m/Q)·max(q,1)·μ0·l_w·λ_w ([1] §4.3).
 * @param analysis winding analysis
 * @param boreRadiusM R [m]; @param stackLengthM L [m]; @param effectiveGapM k_C·g + l_m/μ_rec [m]
 * @param slotPermeance λ_u [-]; @param endWindingLengthM l_w, one end of one coil [m]
 * @param endWindingPermeance λ_w [-]
 */
export function inductancesPerTurn(analysis: WindingAnalysis, boreRadiusM: number, stackLengthM: number, effectiveGapM: number, slotPermeance: number, endWindingLengthM: number, endWindingPermeance: number): InductancesPerTurn {
  const { slots, coilsPerPhase, slotsPerPoleAndPhase } = analysis.layout;
  // Coil turns per series turn of the phase: N_ph = coilsPerPhase·N_c/a, so N_c/a = 1/coilsPerPhase.
  const perCoil = 1 / coilsPerPhase;
  const wa = analysis.windingFunction[0] ?? [];
  const wb = analysis.windingFunction[1] ?? [];
  const ca = analysis.slotTurns[0] ?? [];
  const cb = analysis.slotTurns[1] ?? [];
  let aa = 0;
  let ab = 0;
  let sa = 0;
  let sb = 0;
  for (let s = 0; s < slots; s += 1) {
    aa += (wa[s] ?? 0) ** 2;
    ab += (wa[s] ?? 0) * (wb[s] ?? 0);
    sa += (ca[s] ?? 0) ** 2;
    sb += (ca[s] ?? 0) * (cb[s] ?? 0);
  }
  const interval = (2 * Math.PI) / slots;
  const gapFactor = (MU0 * boreRadiusM * stackLengthM * interval * perCoil * perCoil) / effectiveGapM;
  const airgapSelf = gapFactor * aa;
  const airgapMutual = gapFactor * ab;
  const slotFactor = MU0 * stackLengthM * slotPermeance * perCoil * perCoil;
  const slotSelf = slotFactor * sa;
  const slotMutual = slotFactor * sb;
  const endWinding = ((4 * 3) / slots) * Math.max(slotsPerPoleAndPhase, 1) * MU0 * endWindingLengthM * endWindingPermeance;
  return { self: airgapSelf + slotSelf + endWinding, mutual: airgapMutual + slotMutual, airgapSelf, airgapMutual, slotSelf, slotMutual, endWinding };
}

/**
 * Copper resistivity at a temperature, ρ = ρ20·(1 + α·(T − 20)) ([4]).
 * @param temperatureC [°C]
 * @returns [Ω·m]
 */
export function copperResistivity(temperatureC: number): number {
  return COPPER_RESISTIVITY_20C * (1 + COPPER_TEMP_COEFF * (temperatureC - 20));
}

/**
 * Phase resistance R = ρ·N·l_turn/(a·A_c) ([1] §9).
 * @param resistivityOhmM ρ [Ω·m]; @param seriesTurns N per path [-]; @param meanTurnLengthM [m]
 * @param parallelPaths a [-]; @param conductorAreaM2 copper area of one turn A_c [m²]
 * @returns [Ω]
 */
export function phaseResistance(resistivityOhmM: number, seriesTurns: number, meanTurnLengthM: number, parallelPaths: number, conductorAreaM2: number): number {
  return (resistivityOhmM * seriesTurns * meanTurnLengthM) / (parallelPaths * conductorAreaM2);
}

/**
 * Peak armature MMF across one air gap for a set of phase currents (winding-function model [3]).
 * @param analysis winding analysis
 * @param turnsPerCoilPerPath N_c/a [-]
 * @param currents phase currents A, B, C [A]
 * @returns max |F| [A]
 */
export function peakArmatureMmf(analysis: WindingAnalysis, turnsPerCoilPerPath: number, currents: readonly [number, number, number]): number {
  let peak = 0;
  const slots = analysis.layout.slots;
  for (let s = 0; s < slots; s += 1) {
    let f = 0;
    for (let ph = 0; ph < 3; ph += 1) f += (analysis.windingFunction[ph]?.[s] ?? 0) * (currents[ph] ?? 0);
    peak = Math.max(peak, Math.abs(f * turnsPerCoilPerPath));
  }
  return peak;
}
