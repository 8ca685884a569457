/**
 * Phase-variable model of a three-phase, star-connected BLDC motor without a neutral connection:
 * back-EMF shapes, the state derivative of currents, speed, angle, DC-link voltage and energy
 * integrals, and the checks on the raw parameters.
 *
 * References:
 * [1] P. Pillay, R. Krishnan, "Modeling, simulation, and analysis of permanent-magnet motor drives,
 *     Part II: The brushless DC motor drive", IEEE Trans. Industry Applications 25(2), 1989, 274–279.
 * [2] R. Krishnan, Electric Motor Drives: Modeling, Analysis, and Control, Prentice Hall, 2001, ch. 9.
 * [3] D. Hanselman, Brushless Permanent Magnet Motor Design, 2nd ed., 2006, ch. 7 (six-step drive).
 */
import type { BldcSimulationParams } from '../contracts.js';
import { CalcInputError, requireNonNegative, requirePositive } from '../errors.js';
import { LOAD_QUADRATIC, loadTorque, type LoadState } from './load.js';

/** Width of the back-EMF flat top when the design does not say [electrical degrees]: the ideal trapezoid of [1]. */
export const DEFAULT_FLAT_TOP_ELECTRICAL_DEG = 120;

/**
 * Indices of the state vector. Currents [A], speed [rad/s mechanical], angle [rad mechanical], DC link [V],
 * energies [J]. A const enum so that esbuild writes the numbers into the hot code: V8 re-reads a
 * module-level constant with a hole check on every use, which cost a quarter of the derivative's time.
 */
const enum State {
  CurrentA = 0,
  CurrentB = 1,
  CurrentC = 2,
  Speed = 3,
  Angle = 4,
  DcBus = 5,
  EnergyIn = 6,
  EnergyCopper = 7,
  EnergyLoad = 8,
  EnergyFriction = 9,
  Size = 10,
}
export const S_CURRENT_A = State.CurrentA;
export const S_CURRENT_B = State.CurrentB;
export const S_CURRENT_C = State.CurrentC;
export const S_SPEED = State.Speed;
export const S_ANGLE = State.Angle;
export const S_DC_BUS = State.DcBus;
export const S_ENERGY_IN = State.EnergyIn;
export const S_ENERGY_COPPER = State.EnergyCopper;
export const S_ENERGY_LOAD = State.EnergyLoad;
export const S_ENERGY_FRICTION = State.EnergyFriction;
export const STATE_SIZE = State.Size;

/** Indices of the auxiliary outputs the derivative writes on each call (values at the state it was given); const enum as State. */
const enum Aux {
  NeutralV = 0,
  Torque = 1,
  LoadTorque = 2,
  InputPower = 3,
  /** Back-EMFs of phases a, b, c [V]: Emf + k. */
  Emf = 4,
  /** Phase-to-neutral voltages of phases a, b, c [V]: PhaseV + k. */
  PhaseV = 7,
  /** Terminal (leg) voltages against the negative DC rail [V]: TerminalV + k. */
  TerminalV = 10,
  RectifierCurrent = 13,
  Size = 14,
}
export const AUX_NEUTRAL_V = Aux.NeutralV;
export const AUX_TORQUE = Aux.Torque;
export const AUX_LOAD_TORQUE = Aux.LoadTorque;
export const AUX_INPUT_POWER = Aux.InputPower;
export const AUX_EMF = Aux.Emf;
export const AUX_PHASE_V = Aux.PhaseV;
export const AUX_TERMINAL_V = Aux.TerminalV;
export const AUX_RECTIFIER_CURRENT = Aux.RectifierCurrent;
export const AUX_SIZE = Aux.Size;

/** A right-hand side dx/dt = f(t, x) that writes into `dx` and allocates nothing. */
export type Derivative = (t: number, x: Float64Array, dx: Float64Array) => void;

/**
 * Trapezoidal back-EMF shape of phase a, peak 1, flat top centred on 90° electrical.
 * @param phase fraction of the electrical period [-], 0 to 1 (0 = rising zero crossing)
 * @param halfTransition half the width of one transition [-] (fraction of the period),
 *   (0.5 − flatTop/360)/2; 0 gives a square wave
 * @returns normalised back-EMF [-], −1 to 1
 * Equations: piecewise linear between −1 and +1 with flat tops of (0.5 − 2·halfTransition) periods [1].
 */
export function trapezoidShape(phase: number, halfTransition: number): number {
  if (halfTransition <= 0) return phase < 0.5 ? 1 : -1;
  if (phase < halfTransition) return phase / halfTransition;
  if (phase <= 0.5 - halfTransition) return 1;
  if (phase < 0.5 + halfTransition) return (0.5 - phase) / halfTransition;
  if (phase <= 1 - halfTransition) return -1;
  return (phase - 1) / halfTransition;
}

/**
 * Back-EMF shape of phase a from equally spaced samples over one electrical period, interpolated
 * linearly and periodically.
 * @param phase fraction of the electrical period [-], 0 to 1
 * @param table samples with the first one repeated at the end (length N + 1) [-]
 * @returns normalised back-EMF [-]
 */
export function tableShape(phase: number, table: Float64Array): number {
  const samples = table.length - 1;
  const position = phase * samples;
  const index = Math.min(Math.floor(position), samples - 1);
  const fraction = position - index;
  return (table[index] as number) * (1 - fraction) + (table[index + 1] as number) * fraction;
}

/** Half-width of one back-EMF transition [fraction of the period] for a flat top [electrical degrees]. */
export function halfTransitionFromFlatTop(flatTopElectricalDeg: number): number {
  return (0.5 - flatTopElectricalDeg / 360) / 2;
}

/**
 * Inductance that one phase current sees in a star connection without neutral [H]: L − M, since
 * i_a + i_b + i_c = 0 turns L·i_a + M·(i_b + i_c) into (L − M)·i_a (Eq. (1)–(2) of [1]).
 * @param phaseInductanceH self-inductance L [H]
 * @param mutualInductanceH mutual inductance M [H] (negative or zero by the usual sign convention)
 */
export function effectiveInductance(phaseInductanceH: number, mutualInductanceH: number): number {
  return phaseInductanceH - mutualInductanceH;
}

/**
 * Electrical time constant of the star-connected winding [s]: (L − M) / R.
 * @param params raw parameters (R [Ω], L [H], M [H])
 */
export function electricalTimeConstant(params: BldcSimulationParams): number {
  return effectiveInductance(params.phaseInductanceH, params.mutualInductanceH) / params.phaseResistanceOhm;
}

/**
 * Line-to-line back-EMF constant of a six-step drive [V·s/rad]: two phases in series on their flat
 * tops, 2·k_e. It is also the torque constant per DC-link current [N·m/A] ([2] §9.4).
 * @param backEmfConstantVsPerRad phase flat-top back-EMF per mechanical rad/s [V·s/rad]
 */
export function lineBackEmfConstant(backEmfConstantVsPerRad: number): number {
  return 2 * backEmfConstantVsPerRad;
}

/**
 * Steady no-load speed of the six-step drive on a stiff DC bus with full duty [rad/s]: the speed at
 * which V_dc = 2·k_e·ω + 2·R·I with the friction current I = B·ω/(2·k_e), solved for ω:
 * ω = V_dc / (2·k_e + 2·R·B/(2·k_e)). ([2] §9.4, equivalent DC-motor model.)
 * @param params raw parameters
 * @returns mechanical speed [rad/s]
 */
export function noLoadSpeed(params: BldcSimulationParams): number {
  const lineConstant = lineBackEmfConstant(params.backEmfConstantVsPerRad);
  return params.dcBusV / (lineConstant + (2 * params.phaseResistanceOhm * params.viscousFrictionNmsPerRad) / lineConstant);
}

/**
 * Checks the raw parameters; throws CalcInputError naming the field (prefixed by `field`).
 * Rules: R, L, k_e, p, J, V_dc positive; B zero or more; |M| < L (coupling below one, so L − M > 0);
 * flat top in (0, 180] electrical degrees; a given shape has at least 6 finite samples within ±2.
 */
export function validateSimulationParams(params: BldcSimulationParams, field: string): void {
  requirePositive(`${field}.phaseResistanceOhm`, params.phaseResistanceOhm);
  requirePositive(`${field}.phaseInductanceH`, params.phaseInductanceH);
  if (!Number.isFinite(params.mutualInductanceH) || Math.abs(params.mutualInductanceH) >= params.phaseInductanceH) {
    throw new CalcInputError(`${field}.mutualInductanceH`, 'must be smaller in magnitude than phaseInductanceH');
  }
  requirePositive(`${field}.backEmfConstantVsPerRad`, params.backEmfConstantVsPerRad);
  requirePositive(`${field}.flatTopElectricalDeg`, params.flatTopElectricalDeg);
  if (params.flatTopElectricalDeg > 180) throw new CalcInputError(`${field}.flatTopElectricalDeg`, 'must be at most 180');
  if (!Number.isInteger(params.polePairs) || params.polePairs < 1) {
    throw new CalcInputError(`${field}.polePairs`, 'must be a positive integer');
  }
  requirePositive(`${field}.inertiaKgM2`, params.inertiaKgM2);
  requireNonNegative(`${field}.viscousFrictionNmsPerRad`, params.viscousFrictionNmsPerRad);
  requirePositive(`${field}.dcBusV`, params.dcBusV);
  const shape = params.backEmfShape;
  if (shape !== undefined) {
    if (shape.length < 6 || shape.some((value) => !Number.isFinite(value) || Math.abs(value) > 2)) {
      throw new CalcInputError(`${field}.backEmfShape`, 'must have at least 6 finite samples within ±2');
    }
  }
}

/** What the BLDC derivative reads; the arrays are shared with the inverter and changed between steps. */
export interface BldcModelConfig {
  phaseResistanceOhm: number;
  /** L − M [H]. */
  effectiveInductanceH: number;
  backEmfConstantVsPerRad: number;
  polePairs: number;
  /** Motor plus load inertia [kg·m²]. */
  totalInertiaKgM2: number;
  viscousFrictionNmsPerRad: number;
  /** Half-width of a transition for the trapezoid [-]; ignored when shapeTable is given. */
  halfTransition: number;
  /** Periodic shape samples with the first repeated at the end, or null for the trapezoid. */
  shapeTable: Float64Array | null;
  /** Per leg: terminal voltage as a multiple of the DC-link voltage [-] (duty, 1 or 0). */
  legFactor: Float64Array;
  /** Per leg: 1 when the phase conducts (switch or diode), 0 when it floats with zero current. */
  closed: Float64Array;
  load: LoadState;
  /** Rectifier feeding the DC link, or null for a stiff DC bus. */
  rectifier: null | {
    /** Peak line-to-line voltage √2·V_LL [V]. */
    peakLineV: number;
    angularFrequency: number;
    capacitanceF: number;
    sourceResistanceOhm: number;
  };
  /** Written on every call: neutral voltage, torques, power, EMFs, phase and terminal voltages. */
  aux: Float64Array;
}

const TWO_PI = 2 * Math.PI;
const ONE_THIRD = 1 / 3;
const HALF_SQRT3 = Math.sqrt(3) / 2;
/** Shift of each phase's back-EMF in its electrical period: a, b (−120°), c (+120°) [-]. */
const PHASE_OFFSET = [0, -ONE_THIRD, ONE_THIRD] as const;
/** LOAD_QUADRATIC of load.ts as a const enum member (see State). */
const enum LoadKindIndex {
  Quadratic = 1,
}
if ((LoadKindIndex.Quadratic as number) !== LOAD_QUADRATIC) throw new Error('LoadKindIndex.Quadratic must equal LOAD_QUADRATIC');

/** Number of leading state entries the derivative reads (currents, speed, angle, DC link) [-]; the energies after them are pure quadratures. */
export const DYNAMIC_STATE_SIZE = 6;

/**
 * The state derivative of the star-connected BLDC with its inverter legs ([1] Eqs. (1)–(6)).
 * For the conducting (closed) phases k, with terminal voltages v_k, back-EMFs e_k = k_e·ω·f_k(p·θ):
 *   v_n = Σ_closed (v_k − e_k) / n_closed                      (Σ i = 0 and Σ di/dt = 0)
 *   di_k/dt = (v_k − v_n − R·i_k − e_k) / (L − M)               ([1] Eq. (3))
 *   T_e = Σ e_k·i_k / ω = k_e·Σ f_k·i_k                          ([1] Eq. (4))
 *   J·dω/dt = T_e − T_L − B·ω,  dθ/dt = ω                        ([1] Eq. (5))
 * A floating phase keeps zero current; with fewer than two closed phases no current flows.
 * The DC-link voltage is constant, or C·dv/dt = i_rect − i_dc with the six-pulse rectifier current
 * i_rect = max(0, (v_src − v)/R_s). Energies: dE_in/dt = Σ v_k·i_k (= v·i_dc), dE_cu/dt = R·Σ i²,
 * dE_load/dt = T_L·ω, dE_fric/dt = B·ω².
 *
 * Why the shape of this class: the simulation evaluates the derivative four times per step, a
 * million steps per simulated second. The equations live once, in `derive`, which reads its state
 * from numeric fields and leaves its results in numeric fields: V8 does not inline a function this
 * long, and it boxes (allocates) every floating-point argument and return value of a call it does
 * not inline, while field reads and writes allocate nothing. The RK4 step (stepAhead) keeps its
 * stages in local variables around those calls and its start and end in fields, so the simulation
 * can chain steps between switching events without copying vectors (startFrom, stepAhead,
 * acceptStep, writeStart); `rk4Step` is the same step with vectors in and out. When two legs conduct
 * and the third floats at zero current on a stiff bus (most of a six-step period), the step runs the
 * two-leg equations, which give the same numbers with a third less work. `evaluate` is the general
 * entry with state and derivative as vectors.
 */
export class BldcModel {
  /** Time of the next evaluation [s] (read by the rectifier only); the start of the step for rk4Step. */
  time = 0;
  /** Length of the step rk4Step takes [s]. */
  stepS = 0;

  // State that derive() reads: currents [A], mechanical speed [rad/s], angle [rad], DC link [V].
  private ia = 0;
  private ib = 0;
  private ic = 0;
  private speed = 0;
  private angle = 0;
  private vdc = 0;

  // What derive() leaves: the derivative of the dynamic states and the powers the energies integrate…
  private dia = 0;
  private dib = 0;
  private dic = 0;
  private dSpeed = 0;
  private dVdc = 0;
  private inputPower = 0;
  private copperLoss = 0;
  private loadPower = 0;
  private frictionLoss = 0;
  // …and the auxiliary outputs at that state.
  private neutral = 0;
  private ea = 0;
  private eb = 0;
  private ec = 0;
  private va = 0;
  private vb = 0;
  private vc = 0;
  /** Electromagnetic torque at the last evaluation [N·m]. */
  torque = 0;
  private loadTorqueNm = 0;
  private rectifierCurrent = 0;
  /** Rectifier output voltage [V] at sourceTime [s] (see derive). */
  private sourceV = 0;
  private sourceTime = Number.NaN;

  // The step's start (startFrom, acceptStep): state and derivative there [S_ quantities].
  private startA = 0;
  private startB = 0;
  private startC = 0;
  private startSpeed = 0;
  private startAngle = 0;
  private startVdc = 0;
  private startIn = 0;
  private startCopper = 0;
  private startLoad = 0;
  private startFriction = 0;
  private slopeA = 0;
  private slopeB = 0;
  private slopeC = 0;
  private slopeSpeed = 0;
  private slopeAngle = 0;
  private slopeVdc = 0;
  private slopeIn = 0;
  private slopeCopper = 0;
  private slopeLoad = 0;
  private slopeFriction = 0;
  // The step's end (stepAhead); read by the simulation between events.
  endA = 0;
  endB = 0;
  endC = 0;
  endSpeed = 0;
  endAngle = 0;
  endVdc = 0;
  endIn = 0;
  endCopper = 0;
  endLoad = 0;
  endFriction = 0;
  /** Terminal voltage of the floating leg at the end of stepAhead(false) [V] (when exactly one leg floats; with full outputs, writeAux gives it). */
  openTerminalV = 0;
  /** True while startFrom found the two-leg case; then openLeg is the floating leg. */
  twoLegs = false;
  private openLeg = 0;
  private offsetP = 0;
  private offsetQ = 0;
  private offsetOpen = 0;
  /** Terminal voltages of the two closed legs, fixed on a stiff bus [V]. */
  private voltageP = 0;
  private voltageQ = 0;
  /** Position of phase a in its electrical period at the last deriveTwoLegs [-]. */
  private phaseA = 0;
  /** Two-leg state and derivative: currents of the closed legs p < q [A] and their slopes [A/s]. */
  private currentP = 0;
  private currentQ = 0;
  private slopeCurrentP = 0;
  private slopeCurrentQ = 0;

  private readonly resistance: number;
  private readonly inverseInductance: number;
  private readonly ke: number;
  /** p/(2π): electrical periods per mechanical radian [1/rad]. */
  private readonly periodsPerRad: number;
  private readonly inverseInertia: number;
  private readonly friction: number;
  /** Slope of the trapezoid's transitions, 1/halfTransition [-]. */
  private readonly slope: number;
  private readonly square: boolean;
  private readonly table: Float64Array | null;
  private readonly legFactor: Float64Array;
  private readonly closed: Float64Array;
  private readonly load: LoadState;
  private readonly rectifier: BldcModelConfig['rectifier'];

  constructor(config: BldcModelConfig) {
    this.resistance = config.phaseResistanceOhm;
    this.inverseInductance = 1 / config.effectiveInductanceH;
    this.ke = config.backEmfConstantVsPerRad;
    this.periodsPerRad = config.polePairs / TWO_PI;
    this.inverseInertia = 1 / config.totalInertiaKgM2;
    this.friction = config.viscousFrictionNmsPerRad;
    const halfTransition = config.halfTransition;
    this.square = halfTransition <= 0;
    this.slope = this.square ? 0 : 1 / halfTransition;
    this.table = config.shapeTable;
    this.legFactor = config.legFactor;
    this.closed = config.closed;
    this.load = config.load;
    this.rectifier = config.rectifier;
  }

  /**
   * Writes dx = f(t, x) and, when `aux` is given, the auxiliary outputs at (t, x), with t = this.time.
   * Reads only the first DYNAMIC_STATE_SIZE entries of x. No allocation.
   * @param x state (see the S_ indices)
   * @param dx derivative, written in full
   * @param aux auxiliary outputs (AUX_ indices), or null when nobody reads them
   */
  evaluate(x: Float64Array, dx: Float64Array, aux: Float64Array | null): void {
    this.ia = x[State.CurrentA] as number;
    this.ib = x[State.CurrentB] as number;
    this.ic = x[State.CurrentC] as number;
    this.speed = x[State.Speed] as number;
    this.angle = x[State.Angle] as number;
    this.vdc = x[State.DcBus] as number;
    this.derive();
    this.writeDerivative(dx);
    if (aux !== null) this.writeAux(aux);
  }

  /**
   * One classical RK4 step (Hairer, Nørsett & Wanner 1993, Table II.1.2) from (this.time, x) over
   * this.stepS, given k1 = f(t, x): writes x + (h/6)(k1 + 2k2 + 2k3 + k4) into `out`, then
   * f(t + h, out) into `kOut` and the auxiliary outputs there into `aux`. The energy integrals are
   * quadratures (no stage reads them). Leaves this.time at t + h. No allocation.
   * @param x state at the start [S_ indices] @param k1 derivative at the start
   * @param out state at the end @param kOut derivative at the end @param aux auxiliary outputs at the end
   */
  rk4Step(x: Float64Array, k1: Float64Array, out: Float64Array, kOut: Float64Array, aux: Float64Array): void {
    this.startFrom(x, k1);
    this.stepAhead(true);
    out[State.CurrentA] = this.endA;
    out[State.CurrentB] = this.endB;
    out[State.CurrentC] = this.endC;
    out[State.Speed] = this.endSpeed;
    out[State.Angle] = this.endAngle;
    out[State.DcBus] = this.endVdc;
    out[State.EnergyIn] = this.endIn;
    out[State.EnergyCopper] = this.endCopper;
    out[State.EnergyLoad] = this.endLoad;
    out[State.EnergyFriction] = this.endFriction;
    this.writeDerivative(kOut);
    this.writeAux(aux);
  }

  /**
   * Takes a committed state and its derivative as the start of the next step. With it, a caller can
   * chain steps in the fields alone (startFrom, then stepAhead and acceptStep per step, reading the
   * end fields, then writeStart), which is how the simulation runs between switching events.
   * Chooses the two-leg equations when they hold for the whole step: a stiff bus, exactly two legs
   * closed and the third floating with exactly zero current (it then keeps zero current, [1] Table I).
   * @param x state [S_ indices] @param k1 f(t, x)
   */
  startFrom(x: Float64Array, k1: Float64Array): void {
    this.startA = x[State.CurrentA] as number;
    this.startB = x[State.CurrentB] as number;
    this.startC = x[State.CurrentC] as number;
    this.startSpeed = x[State.Speed] as number;
    this.startAngle = x[State.Angle] as number;
    this.startVdc = x[State.DcBus] as number;
    this.startIn = x[State.EnergyIn] as number;
    this.startCopper = x[State.EnergyCopper] as number;
    this.startLoad = x[State.EnergyLoad] as number;
    this.startFriction = x[State.EnergyFriction] as number;
    this.slopeA = k1[State.CurrentA] as number;
    this.slopeB = k1[State.CurrentB] as number;
    this.slopeC = k1[State.CurrentC] as number;
    this.slopeSpeed = k1[State.Speed] as number;
    this.slopeAngle = k1[State.Angle] as number;
    this.slopeVdc = k1[State.DcBus] as number;
    this.slopeIn = k1[State.EnergyIn] as number;
    this.slopeCopper = k1[State.EnergyCopper] as number;
    this.slopeLoad = k1[State.EnergyLoad] as number;
    this.slopeFriction = k1[State.EnergyFriction] as number;
    this.twoLegs = false;
    const closed = this.closed;
    const ca = closed[0] as number;
    const cb = closed[1] as number;
    const cc = closed[2] as number;
    if (this.rectifier !== null || ca + cb + cc !== 2) return;
    const open = ca === 0 ? 0 : cb === 0 ? 1 : 2;
    if (x[open] !== 0) return;
    // The closed legs p < q in phase order, so sums keep the order of derive() and the results its bits.
    const p = open === 0 ? 1 : 0;
    const q = open === 2 ? 1 : 2;
    this.openLeg = open;
    this.offsetP = PHASE_OFFSET[p] as number;
    this.offsetQ = PHASE_OFFSET[q] as number;
    this.offsetOpen = PHASE_OFFSET[open] as number;
    this.voltageP = (this.legFactor[p] as number) * this.startVdc;
    this.voltageQ = (this.legFactor[q] as number) * this.startVdc;
    this.twoLegs = true;
  }

  /**
   * The RK4 step of rk4Step from the start fields over this.stepS, from this.time: the end state
   * into the end fields, the derivative there into the derivative fields, this.time to t + h.
   * @param fullOutputs true: evaluate the end with derive(), so writeDerivative and writeAux may
   *   follow; false (two-leg equations only): the end leaves its derivative, torque and
   *   openTerminalV, which is what acceptStep and the simulation's event checks read
   */
  stepAhead(fullOutputs: boolean): void {
    if (this.twoLegs) {
      this.stepTwoLegs(fullOutputs);
      return;
    }
    const t = this.time;
    const h = this.stepS;
    const half = 0.5 * h;
    const x0 = this.startA;
    const x1 = this.startB;
    const x2 = this.startC;
    const x3 = this.startSpeed;
    const x4 = this.startAngle;
    const x5 = this.startVdc;
    const a0 = this.slopeA;
    const a1 = this.slopeB;
    const a2 = this.slopeC;
    const a3 = this.slopeSpeed;
    const a4 = this.slopeAngle;
    const a5 = this.slopeVdc;

    this.time = t + half;
    this.ia = x0 + half * a0;
    this.ib = x1 + half * a1;
    this.ic = x2 + half * a2;
    this.speed = x3 + half * a3;
    this.angle = x4 + half * a4;
    this.vdc = x5 + half * a5;
    this.derive();
    const b0 = this.dia;
    const b1 = this.dib;
    const b2 = this.dic;
    const b3 = this.dSpeed;
    const b4 = this.speed;
    const b5 = this.dVdc;
    const b6 = this.inputPower;
    const b7 = this.copperLoss;
    const b8 = this.loadPower;
    const b9 = this.frictionLoss;

    this.ia = x0 + half * b0;
    this.ib = x1 + half * b1;
    this.ic = x2 + half * b2;
    this.speed = x3 + half * b3;
    this.angle = x4 + half * b4;
    this.vdc = x5 + half * b5;
    this.derive();
    const c0 = this.dia;
    const c1 = this.dib;
    const c2 = this.dic;
    const c3 = this.dSpeed;
    const c4 = this.speed;
    const c5 = this.dVdc;
    const c6 = this.inputPower;
    const c7 = this.copperLoss;
    const c8 = this.loadPower;
    const c9 = this.frictionLoss;

    this.time = t + h;
    this.ia = x0 + h * c0;
    this.ib = x1 + h * c1;
    this.ic = x2 + h * c2;
    this.speed = x3 + h * c3;
    this.angle = x4 + h * c4;
    this.vdc = x5 + h * c5;
    this.derive();

    const sixth = h / 6;
    const endA = x0 + sixth * (a0 + 2 * b0 + 2 * c0 + this.dia);
    const endB = x1 + sixth * (a1 + 2 * b1 + 2 * c1 + this.dib);
    const endC = x2 + sixth * (a2 + 2 * b2 + 2 * c2 + this.dic);
    const endSpeed = x3 + sixth * (a3 + 2 * b3 + 2 * c3 + this.dSpeed);
    const endAngle = x4 + sixth * (a4 + 2 * b4 + 2 * c4 + this.speed);
    const endVdc = x5 + sixth * (a5 + 2 * b5 + 2 * c5 + this.dVdc);
    this.endIn = this.startIn + sixth * (this.slopeIn + 2 * b6 + 2 * c6 + this.inputPower);
    this.endCopper = this.startCopper + sixth * (this.slopeCopper + 2 * b7 + 2 * c7 + this.copperLoss);
    this.endLoad = this.startLoad + sixth * (this.slopeLoad + 2 * b8 + 2 * c8 + this.loadPower);
    this.endFriction = this.startFriction + sixth * (this.slopeFriction + 2 * b9 + 2 * c9 + this.frictionLoss);
    this.endA = endA;
    this.endB = endB;
    this.endC = endC;
    this.endSpeed = endSpeed;
    this.endAngle = endAngle;
    this.endVdc = endVdc;
    this.ia = endA;
    this.ib = endB;
    this.ic = endC;
    this.speed = endSpeed;
    this.angle = endAngle;
    this.vdc = endVdc;
    this.derive();
    // As writeAux gives it for the (first) floating leg; read only when exactly one floats.
    const closed = this.closed;
    this.openTerminalV = this.neutral + (closed[0] === 0 ? this.ea : closed[1] === 0 ? this.eb : this.ec);
  }

  /**
   * stepAhead in the two-leg case: the same arithmetic on the two closed currents only (the floating
   * one stays exactly zero, the bus voltage exactly constant), a third less work per stage. It is a
   * copy of the general step's formulas because a shared one would carry the third current and the
   * bus through every stage, which is what this saves.
   */
  private stepTwoLegs(fullOutputs: boolean): void {
    const open = this.openLeg;
    const t = this.time;
    const h = this.stepS;
    const half = 0.5 * h;
    const xp = open === 0 ? this.startB : this.startA;
    const xq = open === 2 ? this.startB : this.startC;
    const ap = open === 0 ? this.slopeB : this.slopeA;
    const aq = open === 2 ? this.slopeB : this.slopeC;
    const x3 = this.startSpeed;
    const x4 = this.startAngle;
    const a3 = this.slopeSpeed;
    const a4 = this.slopeAngle;

    this.currentP = xp + half * ap;
    this.currentQ = xq + half * aq;
    this.speed = x3 + half * a3;
    this.angle = x4 + half * a4;
    this.deriveTwoLegs();
    const bp = this.slopeCurrentP;
    const bq = this.slopeCurrentQ;
    const b3 = this.dSpeed;
    const b4 = this.speed;
    const b6 = this.inputPower;
    const b7 = this.copperLoss;
    const b8 = this.loadPower;
    const b9 = this.frictionLoss;

    this.currentP = xp + half * bp;
    this.currentQ = xq + half * bq;
    this.speed = x3 + half * b3;
    this.angle = x4 + half * b4;
    this.deriveTwoLegs();
    const cp = this.slopeCurrentP;
    const cq = this.slopeCurrentQ;
    const c3 = this.dSpeed;
    const c4 = this.speed;
    const c6 = this.inputPower;
    const c7 = this.copperLoss;
    const c8 = this.loadPower;
    const c9 = this.frictionLoss;

    this.currentP = xp + h * cp;
    this.currentQ = xq + h * cq;
    this.speed = x3 + h * c3;
    this.angle = x4 + h * c4;
    this.deriveTwoLegs();

    const sixth = h / 6;
    const endP = xp + sixth * (ap + 2 * bp + 2 * cp + this.slopeCurrentP);
    const endQ = xq + sixth * (aq + 2 * bq + 2 * cq + this.slopeCurrentQ);
    const endSpeed = x3 + sixth * (a3 + 2 * b3 + 2 * c3 + this.dSpeed);
    const endAngle = x4 + sixth * (a4 + 2 * b4 + 2 * c4 + this.speed);
    this.endIn = this.startIn + sixth * (this.slopeIn + 2 * b6 + 2 * c6 + this.inputPower);
    this.endCopper = this.startCopper + sixth * (this.slopeCopper + 2 * b7 + 2 * c7 + this.copperLoss);
    this.endLoad = this.startLoad + sixth * (this.slopeLoad + 2 * b8 + 2 * c8 + this.loadPower);
    this.endFriction = this.startFriction + sixth * (this.slopeFriction + 2 * b9 + 2 * c9 + this.frictionLoss);
    // The floating current and the bus voltage end where they started (zero derivative).
    const endA = open === 0 ? this.startA : endP;
    const endB = open === 1 ? this.startB : open === 0 ? endP : endQ;
    const endC = open === 2 ? this.startC : endQ;
    this.endA = endA;
    this.endB = endB;
    this.endC = endC;
    this.endSpeed = endSpeed;
    this.endAngle = endAngle;
    this.endVdc = this.startVdc;
    this.time = t + h;
    this.speed = endSpeed;
    this.angle = endAngle;
    if (fullOutputs) {
      this.ia = endA;
      this.ib = endB;
      this.ic = endC;
      this.vdc = this.startVdc;
      this.derive();
      return;
    }
    this.currentP = endP;
    this.currentQ = endQ;
    this.deriveTwoLegs();
    this.dia = open === 0 ? 0 : this.slopeCurrentP;
    this.dib = open === 1 ? 0 : open === 0 ? this.slopeCurrentP : this.slopeCurrentQ;
    this.dic = open === 2 ? 0 : this.slopeCurrentQ;
    this.dVdc = 0;
    const offsetOpen = this.offsetOpen;
    let phase = this.phaseA + offsetOpen;
    if (phase < 0) phase += 1;
    else if (phase >= 1 && offsetOpen > 0) phase -= 1;
    const table = this.table;
    const shape = table === null ? this.trapezoid(phase) : tableShape(phase, table);
    this.openTerminalV = this.neutral + this.ke * endSpeed * shape;
  }

  /** Makes the end of the last stepAhead the start of the next step. */
  acceptStep(): void {
    this.startA = this.endA;
    this.startB = this.endB;
    this.startC = this.endC;
    this.startSpeed = this.endSpeed;
    this.startAngle = this.endAngle;
    this.startVdc = this.endVdc;
    this.startIn = this.endIn;
    this.startCopper = this.endCopper;
    this.startLoad = this.endLoad;
    this.startFriction = this.endFriction;
    this.slopeA = this.dia;
    this.slopeB = this.dib;
    this.slopeC = this.dic;
    this.slopeSpeed = this.dSpeed;
    this.slopeAngle = this.endSpeed;
    this.slopeVdc = this.dVdc;
    this.slopeIn = this.inputPower;
    this.slopeCopper = this.copperLoss;
    this.slopeLoad = this.loadPower;
    this.slopeFriction = this.frictionLoss;
  }

  /** The start state as a vector [S_ indices] (after a chain of acceptStep). */
  writeStart(x: Float64Array): void {
    x[State.CurrentA] = this.startA;
    x[State.CurrentB] = this.startB;
    x[State.CurrentC] = this.startC;
    x[State.Speed] = this.startSpeed;
    x[State.Angle] = this.startAngle;
    x[State.DcBus] = this.startVdc;
    x[State.EnergyIn] = this.startIn;
    x[State.EnergyCopper] = this.startCopper;
    x[State.EnergyLoad] = this.startLoad;
    x[State.EnergyFriction] = this.startFriction;
  }

  /**
   * derive() for two closed legs p < q (currents currentP, currentQ) and a floating leg without
   * current: the same derivative bit for bit, since the floating phase adds exact zeros to every sum
   * there and its back-EMF is not needed. Leaves slopeCurrentP, slopeCurrentQ, the mechanical
   * derivative and powers, the neutral voltage, the torque and phase a's position (phaseA).
   */
  private deriveTwoLegs(): void {
    const speed = this.speed;
    const turns = this.periodsPerRad * this.angle;
    const ua = turns - Math.floor(turns);
    this.phaseA = ua;
    // Wrapped as derive() wraps ub and uc, and phase a not at all: ua rounds to 1 for an angle just
    // below zero, and a square EMF differs between positions 1 and 0.
    const offsetP = this.offsetP;
    let up = ua + offsetP;
    if (up < 0) up += 1;
    else if (up >= 1 && offsetP > 0) up -= 1;
    const offsetQ = this.offsetQ;
    let uq = ua + offsetQ;
    if (uq < 0) uq += 1;
    else if (uq >= 1 && offsetQ > 0) uq -= 1;
    const table = this.table;
    const fp = table === null ? this.trapezoid(up) : tableShape(up, table);
    const fq = table === null ? this.trapezoid(uq) : tableShape(uq, table);
    const emfPerUnit = this.ke * speed;
    const ep = emfPerUnit * fp;
    const eq = emfPerUnit * fq;
    const vp = this.voltageP;
    const vq = this.voltageQ;
    const ip = this.currentP;
    const iq = this.currentQ;
    const resistance = this.resistance;
    const neutral = 0.5 * (vp - ep + (vq - eq));
    this.slopeCurrentP = (vp - neutral - resistance * ip - ep) * this.inverseInductance;
    this.slopeCurrentQ = (vq - neutral - resistance * iq - eq) * this.inverseInductance;
    const torque = this.ke * (fp * ip + fq * iq);
    const friction = this.friction;
    const load = this.load;
    // As in derive().
    const loadTorqueNm =
      load.active === 0
        ? 0
        : load.kind === LoadKindIndex.Quadratic
          ? load.quadraticCoefficient * speed * Math.abs(speed)
          : speed > 0
            ? load.torqueNm
            : loadTorque(load, speed, torque - friction * speed);
    this.dSpeed = (torque - loadTorqueNm - friction * speed) * this.inverseInertia;
    this.inputPower = vp * ip + vq * iq;
    this.copperLoss = resistance * (ip * ip + iq * iq);
    this.loadPower = loadTorqueNm * speed;
    this.frictionLoss = friction * speed * speed;
    this.neutral = neutral;
    this.torque = torque;
    this.loadTorqueNm = loadTorqueNm;
  }

  /** The equations (see the class comment) at the state in the fields; results into the fields. */
  private derive(): void {
    const resistance = this.resistance;
    const ke = this.ke;
    const friction = this.friction;
    const ia = this.ia;
    const ib = this.ib;
    const ic = this.ic;
    const speed = this.speed;
    const vdc = this.vdc;

    const turns = this.periodsPerRad * this.angle;
    const ua = turns - Math.floor(turns);
    let ub = ua - ONE_THIRD;
    if (ub < 0) ub += 1;
    let uc = ua + ONE_THIRD;
    if (uc >= 1) uc -= 1;
    let fa: number;
    let fb: number;
    let fc: number;
    const table = this.table;
    if (table === null) {
      fa = this.trapezoid(ua);
      fb = this.trapezoid(ub);
      fc = this.trapezoid(uc);
    } else {
      fa = tableShape(ua, table);
      fb = tableShape(ub, table);
      fc = tableShape(uc, table);
    }
    const emfPerUnit = ke * speed;
    const ea = emfPerUnit * fa;
    const eb = emfPerUnit * fb;
    const ec = emfPerUnit * fc;

    const legFactor = this.legFactor;
    const closed = this.closed;
    const va = (legFactor[0] as number) * vdc;
    const vb = (legFactor[1] as number) * vdc;
    const vc = (legFactor[2] as number) * vdc;
    const ca = closed[0] as number;
    const cb = closed[1] as number;
    const cc = closed[2] as number;
    const closedCount = ca + cb + cc;

    let neutral: number;
    let dia = 0;
    let dib = 0;
    let dic = 0;
    if (closedCount >= 2) {
      const sum = ca * (va - ea) + cb * (vb - eb) + cc * (vc - ec);
      neutral = closedCount === 2 ? 0.5 * sum : sum * ONE_THIRD;
      const inverseInductance = this.inverseInductance;
      dia = ca * (va - neutral - resistance * ia - ea) * inverseInductance;
      dib = cb * (vb - neutral - resistance * ib - eb) * inverseInductance;
      dic = cc * (vc - neutral - resistance * ic - ec) * inverseInductance;
    } else {
      // Fewer than two closed legs carry no current; the neutral matters for the outputs only.
      neutral =
        closedCount === 1
          ? // One closed leg: the neutral sits at its terminal minus its EMF.
            ca * (va - ea) + cb * (vb - eb) + cc * (vc - ec)
          : // All legs open: the neutral floats; take mid-bus less the EMF mean (symmetric stray capacitance).
            0.5 * vdc - (ea + eb + ec) * ONE_THIRD;
    }

    const torque = ke * (fa * ia + fb * ib + fc * ic);
    const load = this.load;
    // loadTorque() of load.ts, inlined for the common cases (a moving shaft).
    const loadTorqueNm =
      load.active === 0
        ? 0
        : load.kind === LoadKindIndex.Quadratic
          ? load.quadraticCoefficient * speed * Math.abs(speed)
          : speed > 0
            ? load.torqueNm
            : loadTorque(load, speed, torque - friction * speed);
    const inputPower = va * ia + vb * ib + vc * ic;

    let rectifierCurrent = 0;
    let dvdc = 0;
    const rectifier = this.rectifier;
    if (rectifier !== null) {
      // max |sin(ωt − k·2π/3)| over the three line voltages, from one sine and one cosine:
      // sin(a ∓ 2π/3) = −½·sin a ∓ (√3/2)·cos a.
      // The two middle RK4 stages and the end of a step and the start of the next share their times.
      if (this.time !== this.sourceTime) {
        const angle = rectifier.angularFrequency * this.time;
        const sine = Math.sin(angle);
        const cosine = HALF_SQRT3 * Math.cos(angle);
        const lineA = Math.abs(sine);
        const lineB = Math.abs(-0.5 * sine - cosine);
        const lineC = Math.abs(-0.5 * sine + cosine);
        this.sourceV = rectifier.peakLineV * (lineA > lineB ? (lineA > lineC ? lineA : lineC) : lineB > lineC ? lineB : lineC);
        this.sourceTime = this.time;
      }
      const source = this.sourceV;
      rectifierCurrent = source > vdc ? (source - vdc) / rectifier.sourceResistanceOhm : 0;
      dvdc = (rectifierCurrent - inputPower / vdc) / rectifier.capacitanceF;
    }

    this.dia = dia;
    this.dib = dib;
    this.dic = dic;
    this.dSpeed = (torque - loadTorqueNm - friction * speed) * this.inverseInertia;
    this.dVdc = dvdc;
    this.inputPower = inputPower;
    this.copperLoss = resistance * (ia * ia + ib * ib + ic * ic);
    this.loadPower = loadTorqueNm * speed;
    this.frictionLoss = friction * speed * speed;
    this.neutral = neutral;
    this.ea = ea;
    this.eb = eb;
    this.ec = ec;
    this.va = va;
    this.vb = vb;
    this.vc = vc;
    this.torque = torque;
    this.loadTorqueNm = loadTorqueNm;
    this.rectifierCurrent = rectifierCurrent;
  }

  /** The derivative derive() left, as a vector [S_ indices]. */
  private writeDerivative(dx: Float64Array): void {
    dx[State.CurrentA] = this.dia;
    dx[State.CurrentB] = this.dib;
    dx[State.CurrentC] = this.dic;
    dx[State.Speed] = this.dSpeed;
    dx[State.Angle] = this.speed;
    dx[State.DcBus] = this.dVdc;
    dx[State.EnergyIn] = this.inputPower;
    dx[State.EnergyCopper] = this.copperLoss;
    dx[State.EnergyLoad] = this.loadPower;
    dx[State.EnergyFriction] = this.frictionLoss;
  }

  /** The auxiliary outputs derive() left [AUX_ indices]. */
  private writeAux(aux: Float64Array): void {
    const neutral = this.neutral;
    const closed = this.closed;
    aux[Aux.NeutralV] = neutral;
    aux[Aux.Torque] = this.torque;
    aux[Aux.LoadTorque] = this.loadTorqueNm;
    aux[Aux.InputPower] = this.inputPower;
    aux[Aux.Emf] = this.ea;
    aux[Aux.Emf + 1] = this.eb;
    aux[Aux.Emf + 2] = this.ec;
    // A floating phase shows its EMF between terminal and neutral.
    const closedA = closed[0] === 1;
    const closedB = closed[1] === 1;
    const closedC = closed[2] === 1;
    aux[Aux.PhaseV] = closedA ? this.va - neutral : this.ea;
    aux[Aux.PhaseV + 1] = closedB ? this.vb - neutral : this.eb;
    aux[Aux.PhaseV + 2] = closedC ? this.vc - neutral : this.ec;
    aux[Aux.TerminalV] = closedA ? this.va : neutral + this.ea;
    aux[Aux.TerminalV + 1] = closedB ? this.vb : neutral + this.eb;
    aux[Aux.TerminalV + 2] = closedC ? this.vc : neutral + this.ec;
    aux[Aux.RectifierCurrent] = this.rectifierCurrent;
  }

  /** trapezoidShape(phase, halfTransition) with the slope precomputed (multiplication, not division). */
  private trapezoid(phase: number): number {
    if (this.square) return phase < 0.5 ? 1 : -1;
    // The trapezoid is a triangle wave (slope ±1, peaks ±¼ at phase ¼ and ¾) scaled by 1/halfTransition
    // and clipped to ±1: one comparison per phase instead of a chain of four.
    const triangle = phase < 0.75 ? 0.25 - Math.abs(phase - 0.25) : phase - 1;
    const value = triangle * this.slope;
    return value > 1 ? 1 : value < -1 ? -1 : value;
  }
}

/**
 * Builds the state derivative of the star-connected BLDC with its inverter legs as a plain function
 * (equations at BldcModel; [1] Eqs. (1)–(6)), writing config.aux on every call.
 * @returns f(t [s], x, dx) writing dx and config.aux; no allocation
 */
export function createBldcDerivative(config: BldcModelConfig): Derivative {
  const model = new BldcModel(config);
  const aux = config.aux;
  return (t: number, x: Float64Array, dx: Float64Array): void => {
    model.time = t;
    model.evaluate(x, dx, aux);
  };
}

/**
 * Builds the periodic lookup table for a sampled back-EMF shape (first sample repeated at the end).
 * @param shape samples over one electrical period from 0 [-]
 */
export function shapeTableFrom(shape: readonly number[]): Float64Array {
  const table = new Float64Array(shape.length + 1);
  shape.forEach((value, index) => {
    table[index] = value;
  });
  table[shape.length] = shape[0] as number;
  return table;
}
