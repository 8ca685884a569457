/**
 * Sizing of the BLDC that replaces a motor: resolves the request (supply → DC bus, frame → limits,
 * materials, targets), enumerates slot/pole combinations (tooth-coil and distributed windings by
 * the star of slots) and continuous variables (split ratio, stack length or current density),
 * ranks the feasible designs by the objective and, when none is feasible, names the limiting
 * constraint and finds the nearest feasible alternative (longer stack, next frame, hotter grade).
 *
 * References: see design.ts; the search itself is an exhaustive grid (common practice for
 * analytic sizing, e.g. Hendershot and Miller, Design of Brushless Permanent-Magnet Machines, ch. 1).
 */
import { CalcInputError, requireInRange, requirePositive } from '../errors.js';
import {
  DC_BUS_LOAD_DROP,
  DEFAULT_TARGETS,
  MAX_ELECTRICAL_FREQUENCY_HZ,
  NATURAL_COOLING_CURRENT_DENSITY,
  RECTIFIER_DC_RATIO,
  type Cooling,
  type DesignTargets,
  type DriveKind,
  type Objective,
} from './defaults.js';
import { evaluateDesign, magneticDesign, type BldcDesign, type BldcSpec, type Candidate, type Constraint, type RejectedCandidate } from './design.js';
import { analyseWinding, type WindingAnalysis } from './electrical.js';
import { frameLimits, nextLargerFrame, standardFrameFor, STACK_LENGTH_PER_FOOT_SPACING, STATOR_DIAMETER_PER_SHAFT_HEIGHT, type FrameLimits } from './frames.js';
import { MAGNET_GRADES, resolveMagnet, resolveSteel, type LaminationSteel, type MagnetGrade } from './materials.js';
import { windingLayout, type SlotSide, type WindingHarmonic } from './winding.js';

/** What `size-bldc` accepts. */
export interface BldcInput {
  ratedPowerKw: number;
  speedRpm: number;
  /** AC line-to-line voltage (rectified) or the DC bus voltage when supplyType is 'dc' [V]. */
  supplyVoltageV: number;
  supplyType?: 'ac' | 'dc';
  frequencyHz?: number;
  frame?: string;
  maxStatorOuterDiameterMm?: number;
  maxStackLengthMm?: number;
  magnet?: string | MagnetGrade;
  steel?: string | LaminationSteel;
  objective?: Objective;
  cooling?: Cooling;
  drive?: DriveKind;
  targets?: Partial<DesignTargets>;
  slots?: number;
  poles?: number;
  layers?: 1 | 2;
  coilPitch?: number;
  minEfficiencyPct?: number;
  /** How many designs to return in `alternatives` [-], default 3. */
  alternatives?: number;
}

export interface DesignSummary {
  slots: number;
  poles: number;
  layers: 1 | 2;
  coilPitch: number;
  feasible: boolean;
  limitingConstraint: string;
  splitRatio: number;
  statorOuterDiameterMm: number;
  stackLengthMm: number;
  efficiencyPct: number;
  systemEfficiencyPct: number;
  activeMaterialCost: number;
  totalMassKg: number;
  why: string;
}

export interface NearestFeasible {
  /** Input field to change. */
  field: 'maxStackLengthMm' | 'frame' | 'magnet' | 'maxStatorOuterDiameterMm';
  value: string | number;
  description: string;
  design: DesignSummary;
}

export type BldcResult = Partial<Omit<BldcDesign, 'feasible' | 'limitingConstraint' | 'constraints'>> & {
  feasible: boolean;
  limitingConstraint: string;
  constraints: Constraint[];
  frame: FrameLimits;
  nearestFeasible?: NearestFeasible;
  alternatives: DesignSummary[];
  search: { combinations: number; candidatesEvaluated: number; feasibleCount: number };
  winding?: {
    slotsPerPoleAndPhase: number;
    distributionFactor: number;
    pitchFactor: number;
    periodicity: number;
    balanced: boolean;
    harmonics: WindingHarmonic[];
    sides: SlotSide[];
  };
  assumptions: string[];
};

/** Split ratios D/D_o tried by the search [-] (SPM range, common practice). */
export const SPLIT_RATIOS = [0.45, 0.5, 0.55, 0.6, 0.65, 0.7, 0.75];

/**
 * The split ratios worth trying for p pole pairs: a window of five that rises with the pole count,
 * 0.45–0.65 for p = 1 up to 0.55–0.75 for p ≥ 3 (thinner yokes leave room for a larger bore; common
 * practice, no source).
 */
export function splitRatiosFor(polePairs: number): number[] {
  const low = Math.min(0.45 + 0.05 * (polePairs - 1), 0.55) - 1e-9;
  return SPLIT_RATIOS.filter((s) => s >= low && s <= low + 0.2 + 2e-9);
}
/** Current-density fractions of the target tried (the stack follows) [-]; plus the frame's full stack. */
export const CURRENT_DENSITY_FRACTIONS = [1, 0.8, 0.6];
/** Coarser grid for the nearest-feasible searches [-]. */
export const NEAREST_SPLIT_RATIOS = [0.55, 0.65, 0.75];
export const NEAREST_CURRENT_DENSITY_FRACTIONS = [1];
/** Most slots enumerated [-]. */
export const MAX_SLOTS = 72;
/** Most poles enumerated [-]. */
export const MAX_POLES = 40;

const OBJECTIVE_LABEL: Record<Objective, string> = { cost: 'active-material cost', efficiency: 'motor-plus-drive losses', mass: 'active mass' };

/**
 * Turns the request into a resolved spec, validating every field.
 * @throws CalcInputError naming the field
 */
export function resolveSpec(input: BldcInput): BldcSpec {
  requireInRange('ratedPowerKw', input.ratedPowerKw, 0.05, 2000);
  requireInRange('speedRpm', input.speedRpm, 100, 30000);
  requirePositive('supplyVoltageV', input.supplyVoltageV);
  requireInRange('supplyVoltageV', input.supplyVoltageV, 12, 1500);
  if (input.frequencyHz !== undefined) requireInRange('frequencyHz', input.frequencyHz, 10, 400);
  if (input.minEfficiencyPct !== undefined) requireInRange('minEfficiencyPct', input.minEfficiencyPct, 1, 99.9);
  const cooling: Cooling = input.cooling ?? 'tefc';
  const targets: DesignTargets = {
    ...DEFAULT_TARGETS,
    ...(cooling === 'natural' ? { currentDensityAPerMm2: NATURAL_COOLING_CURRENT_DENSITY } : {}),
    ...(input.targets ?? {}),
  };
  const ranges: Array<[keyof DesignTargets, number, number]> = [
    ['airgapFluxDensityT', 0.1, 1.2],
    ['toothFluxDensityT', 0.8, 2.3],
    ['yokeFluxDensityT', 0.5, 2.3],
    ['currentDensityAPerMm2', 0.5, 20],
    ['slotFill', 0.15, 0.75],
    ['voltageMarginPct', 0, 50],
    ['magnetTemperatureC', -40, 220],
    ['windingTemperatureC', -20, 220],
    ['poleArcFraction', 0.5, 1],
    ['airgapMm', 0, 10],
    ['currentLimitFactor', 1, 5],
    ['minDemagnetisationMarginPct', 0, 90],
  ];
  for (const [key, min, max] of ranges) requireInRange(`targets.${key}`, targets[key], min, max);
  const dcBusV = input.supplyType === 'dc' ? input.supplyVoltageV : RECTIFIER_DC_RATIO * input.supplyVoltageV * (1 - DC_BUS_LOAD_DROP);
  return {
    ratedPowerW: input.ratedPowerKw * 1000,
    speedRpm: input.speedRpm,
    dcBusV,
    cooling,
    drive: input.drive ?? 'six-step',
    frame: resolveFrame(input),
    magnet: resolveMagnet(input.magnet),
    steel: resolveSteel(input.steel),
    targets,
    objective: input.objective ?? 'cost',
    ...(input.minEfficiencyPct !== undefined ? { minEfficiencyPct: input.minEfficiencyPct } : {}),
  };
}

/** Pole count of the induction motor a speed belongs to: 2·round(60·f/n) [-]. */
export function equivalentPoles(speedRpm: number, frequencyHz: number): number {
  return 2 * Math.max(1, Math.round((60 * frequencyHz) / speedRpm));
}

function resolveFrame(input: BldcInput): FrameLimits {
  if (input.maxStatorOuterDiameterMm !== undefined) requireInRange('maxStatorOuterDiameterMm', input.maxStatorOuterDiameterMm, 20, 2000);
  if (input.maxStackLengthMm !== undefined) requireInRange('maxStackLengthMm', input.maxStackLengthMm, 10, 3000);
  let frame: FrameLimits | undefined;
  if (input.frame !== undefined) frame = frameLimits(input.frame);
  else if (input.maxStatorOuterDiameterMm === undefined || input.maxStackLengthMm === undefined) {
    const poles = equivalentPoles(input.speedRpm, input.frequencyHz ?? 50);
    const standard = standardFrameFor(input.ratedPowerKw, poles);
    if (standard === undefined && (input.maxStatorOuterDiameterMm === undefined || input.maxStackLengthMm === undefined)) {
      throw new CalcInputError('frame', `is needed: no standard frame is listed for ${input.ratedPowerKw} kW at ${poles} poles; give a frame or maxStatorOuterDiameterMm and maxStackLengthMm`);
    }
    if (standard !== undefined) frame = frameLimits(standard);
  }
  const base: FrameLimits = frame ?? { system: 'free', designation: 'free limits', shaftHeightMm: 0, maxStatorOuterDiameterMm: 0, maxStackLengthMm: 0 };
  return {
    ...base,
    maxStatorOuterDiameterMm: input.maxStatorOuterDiameterMm ?? base.maxStatorOuterDiameterMm,
    maxStackLengthMm: input.maxStackLengthMm ?? base.maxStackLengthMm,
  };
}

interface Combination {
  slots: number;
  poles: number;
  layers: 1 | 2;
  coilPitch: number;
}

/**
 * Slot/pole combinations worth trying: double-layer tooth-coil windings with 1/4 < q ≤ 1/2 and
 * distributed windings with q = 1…4 (full pitch, and 5/6 pitch for q ≥ 2); each must be balanced
 * with k_w1 ≥ 0.85 (Cros and Viarouge 2002); the electrical frequency stays below
 * MAX_ELECTRICAL_FREQUENCY_HZ.
 * @param speedRpm rated speed [rpm]; @param fixed slots/poles/layers/pitch the user fixed
 */
export function slotPoleCombinations(speedRpm: number, fixed: Pick<BldcInput, 'slots' | 'poles' | 'layers' | 'coilPitch'> = {}): Combination[] {
  return candidateCombinations(speedRpm, fixed).filter((c) => {
    const layout = windingLayout(c.slots, c.poles, c.layers, c.coilPitch);
    return layout.balanced && layout.windingFactor >= 0.85;
  });
}

function candidateCombinations(speedRpm: number, fixed: Pick<BldcInput, 'slots' | 'poles' | 'layers' | 'coilPitch'>): Combination[] {
  if (fixed.slots !== undefined && fixed.poles !== undefined) {
    return [{ slots: fixed.slots, poles: fixed.poles, layers: fixed.layers ?? 2, coilPitch: fixed.coilPitch ?? Math.max(1, Math.round(fixed.slots / fixed.poles)) }];
  }
  const maxPolePairs = Math.max(1, Math.min(MAX_POLES / 2, Math.floor((MAX_ELECTRICAL_FREQUENCY_HZ * 60) / speedRpm)));
  const out: Combination[] = [];
  for (let p = 1; p <= maxPolePairs; p += 1) {
    if (fixed.poles !== undefined && fixed.poles !== 2 * p) continue;
    for (let Q = 3; Q <= MAX_SLOTS; Q += 3) {
      if (fixed.slots !== undefined && fixed.slots !== Q) continue;
      if (Q === 2 * p) continue;
      const q = Q / (6 * p);
      if (q > 0.25 && q <= 0.5) out.push({ slots: Q, poles: 2 * p, layers: 2, coilPitch: 1 });
      if (Number.isInteger(q) && q >= 1 && q <= 4) {
        out.push({ slots: Q, poles: 2 * p, layers: 2, coilPitch: 3 * q });
        if (q >= 2) out.push({ slots: Q, poles: 2 * p, layers: 2, coilPitch: 3 * q - Math.round((3 * q) / 6) });
      }
    }
  }
  return out;
}

function balancedAnalyses(combinations: readonly Combination[]): WindingAnalysis[] {
  return combinations.map((c) => windingLayout(c.slots, c.poles, c.layers, c.coilPitch)).filter((l) => l.balanced && l.windingFactor >= 0.85).map(analyseWinding);
}

type Evaluated = BldcDesign | RejectedCandidate;

function isDesign(e: Evaluated): e is BldcDesign {
  return !('rejected' in e);
}

function worstUtilisation(e: Evaluated): number {
  return e.constraints.filter((c) => !c.satisfied).reduce((m, c) => Math.max(m, c.utilisation), 1);
}

interface SearchOutcome {
  evaluated: number;
  designs: Array<{ design: BldcDesign; analysis: WindingAnalysis; candidate: Candidate }>;
  bestRejected?: RejectedCandidate;
}

function runSearch(spec: BldcSpec, analyses: WindingAnalysis[], splits: readonly number[] | undefined, fractions: readonly number[]): SearchOutcome {
  const designs: SearchOutcome['designs'] = [];
  let bestRejected: RejectedCandidate | undefined;
  let evaluated = 0;
  const Do = spec.frame.maxStatorOuterDiameterMm / 1000;
  const stackChoices: Candidate['stack'][] = [
    ...fractions.map((fraction) => ({ kind: 'current-density' as const, fraction })),
    { kind: 'length' as const, lengthM: spec.frame.maxStackLengthMm / 1000 },
  ];
  for (const analysis of analyses) {
    const polePairs = analysis.layout.poles / 2;
    for (const splitRatio of splits ?? splitRatiosFor(polePairs)) {
      const prepared = magneticDesign(spec, analysis, splitRatio, Do);
      for (const stack of stackChoices) {
        const candidate: Candidate = { splitRatio, outerDiameterM: Do, stack };
        const result = 'rejected' in prepared ? prepared : evaluateDesign(spec, analysis, candidate, false, true, prepared);
        evaluated += 1;
        if (isDesign(result)) designs.push({ design: result, analysis, candidate });
        else if (!bestRejected || worstUtilisation(result) < worstUtilisation(bestRejected)) bestRejected = result;
      }
    }
  }
  return { evaluated, designs, ...(bestRejected ? { bestRejected } : {}) };
}

function rank(designs: SearchOutcome['designs']): SearchOutcome['designs'] {
  return [...designs].sort((a, b) => {
    if (a.design.feasible !== b.design.feasible) return a.design.feasible ? -1 : 1;
    if (!a.design.feasible) return worstUtilisation(a.design) - worstUtilisation(b.design);
    return a.design.objectiveValue - b.design.objectiveValue || b.design.systemEfficiencyPct - a.design.systemEfficiencyPct;
  });
}

function summary(design: BldcDesign, why: string): DesignSummary {
  return {
    slots: design.slots,
    poles: design.poles,
    layers: design.layers,
    coilPitch: design.coilPitch,
    feasible: design.feasible,
    limitingConstraint: design.limitingConstraint,
    splitRatio: design.geometry.splitRatio,
    statorOuterDiameterMm: design.geometry.statorOuterDiameterMm,
    stackLengthMm: design.geometry.stackLengthMm,
    efficiencyPct: design.efficiencyPct,
    systemEfficiencyPct: design.systemEfficiencyPct,
    activeMaterialCost: design.activeMaterialCost,
    totalMassKg: design.massKg.total,
    why,
  };
}

/**
 * Sizes the surface-PM BLDC for a request: full search, ranking, alternatives, nearest feasible.
 * @param input request (see BldcInput; power [kW], speed [rpm], supply [V], frame or limits [mm])
 * @returns the best design (all BldcDesign fields with waveforms), its constraints and why, the
 *   best few alternatives, the nearest feasible alternative when infeasible, and the assumptions
 * @throws CalcInputError for invalid input
 */
export function sizeBldc(input: BldcInput): BldcResult {
  const spec = resolveSpec(input);
  const analyses = balancedAnalyses(candidateCombinations(spec.speedRpm, input));
  if (analyses.length === 0) throw new CalcInputError(input.slots !== undefined ? 'slots' : 'poles', 'gives no balanced winding with a winding factor of 0.85 or more');
  const combinations = analyses;
  const outcome = runSearch(spec, analyses, undefined, CURRENT_DENSITY_FRACTIONS);
  const ranked = rank(outcome.designs);
  const feasibleCount = ranked.filter((r) => r.design.feasible).length;
  const assumptions = describeAssumptions(spec, input);
  const search = { combinations: combinations.length, candidatesEvaluated: outcome.evaluated, feasibleCount };
  const top = ranked[0];

  let nearestFeasible: NearestFeasible | undefined;
  if (!top?.design.feasible) nearestFeasible = findNearestFeasible(spec, analyses, top?.design.limitingConstraint ?? outcome.bestRejected?.limitingConstraint ?? '');

  if (!top) {
    const rejected = outcome.bestRejected as RejectedCandidate;
    return {
      feasible: false,
      limitingConstraint: rejected.limitingConstraint,
      constraints: rejected.constraints,
      frame: spec.frame,
      ...(nearestFeasible ? { nearestFeasible } : {}),
      alternatives: [],
      search,
      assumptions,
    };
  }

  const best = evaluateDesign(spec, top.analysis, top.candidate, true) as BldcDesign;
  const alternatives = pickAlternatives(ranked, spec.objective, Math.max(1, Math.min(input.alternatives ?? 3, 10)), feasibleCount);
  const layout = top.analysis.layout;
  const { objectiveValue: _objectiveValue, ...designFields } = best;
  return {
    ...designFields,
    frame: spec.frame,
    ...(nearestFeasible ? { nearestFeasible } : {}),
    alternatives,
    search,
    winding: {
      slotsPerPoleAndPhase: layout.slotsPerPoleAndPhase,
      distributionFactor: layout.distributionFactor,
      pitchFactor: layout.pitchFactor,
      periodicity: layout.periodicity,
      balanced: layout.balanced,
      harmonics: layout.harmonics,
      sides: layout.sides,
    },
    assumptions,
  };
}

function pickAlternatives(ranked: SearchOutcome['designs'], objective: Objective, count: number, feasibleCount: number): DesignSummary[] {
  const seen = new Set<string>();
  const out: DesignSummary[] = [];
  const first = ranked[0]?.design;
  for (const { design } of ranked) {
    const key = `${design.slots}/${design.poles}/${design.coilPitch}`;
    if (seen.has(key)) continue;
    seen.add(key);
    let why: string;
    if (!first || design === first) {
      why = design.feasible
        ? `lowest ${OBJECTIVE_LABEL[objective]} of ${feasibleCount} feasible candidates; limit closest to binding: ${design.limitingConstraint}`
        : `no candidate meets every limit; this one breaks "${design.limitingConstraint}" least`;
    } else {
      const costDelta = ((design.activeMaterialCost - first.activeMaterialCost) / first.activeMaterialCost) * 100;
      const effDelta = design.systemEfficiencyPct - first.systemEfficiencyPct;
      const massDelta = ((design.massKg.total - first.massKg.total) / first.massKg.total) * 100;
      why = `${design.feasible ? 'feasible' : `breaks "${design.limitingConstraint}"`}; best of ${design.slots} slots / ${design.poles} poles: cost ${costDelta >= 0 ? '+' : ''}${costDelta.toFixed(1)} %, mass ${massDelta >= 0 ? '+' : ''}${massDelta.toFixed(1)} %, efficiency ${effDelta >= 0 ? '+' : ''}${effDelta.toFixed(2)} points vs the first`;
    }
    out.push(summary(design, why));
    if (out.length >= count) break;
  }
  return out;
}

function findNearestFeasible(spec: BldcSpec, analyses: WindingAnalysis[], limiting: string): NearestFeasible | undefined {
  const tries: Array<{ field: NearestFeasible['field']; value: string | number; description: string; spec: BldcSpec }> = [];
  if (limiting === 'demagnetisation margin' || limiting === 'magnet temperature') {
    for (const grade of MAGNET_GRADES.filter((g) => g.family === spec.magnet.family && g.maxTemperatureC > spec.magnet.maxTemperatureC).sort((a, b) => a.pricePerKg - b.pricePerKg)) {
      tries.push({ field: 'magnet', value: grade.name, description: `magnet grade ${grade.name} (${grade.maxTemperatureC} °C class)`, spec: { ...spec, magnet: grade } });
    }
  }
  // Interleave longer stacks with larger frames (the frame list runs on until one fits).
  let frame: FrameLimits | undefined = spec.frame;
  const factors = [1.25, 1.5, 2, 3];
  for (let step = 0; step < 10; step += 1) {
    const factor = factors[step];
    if (factor !== undefined) {
      const maxStackLengthMm = spec.frame.maxStackLengthMm * factor;
      tries.push({ field: 'maxStackLengthMm', value: Math.round(maxStackLengthMm), description: `a stack up to ${Math.round(maxStackLengthMm)} mm (×${factor})`, spec: { ...spec, frame: { ...spec.frame, maxStackLengthMm } } });
    }
    if (spec.frame.system === 'free') {
      if (factor === undefined) break;
      const maxStatorOuterDiameterMm = spec.frame.maxStatorOuterDiameterMm * (1 + (factor - 1) / 2);
      tries.push({ field: 'maxStatorOuterDiameterMm', value: Math.round(maxStatorOuterDiameterMm), description: `a stator outer diameter up to ${Math.round(maxStatorOuterDiameterMm)} mm`, spec: { ...spec, frame: { ...spec.frame, maxStatorOuterDiameterMm } } });
    } else {
      frame = frame ? nextLargerFrame(frame) : undefined;
      if (frame) tries.push({ field: 'frame', value: frame.designation, description: `the next larger frame ${frame.system} ${frame.designation}`, spec: { ...spec, frame } });
    }
  }
  for (const attempt of tries) {
    const outcome = runSearch(attempt.spec, analyses, NEAREST_SPLIT_RATIOS, NEAREST_CURRENT_DENSITY_FRACTIONS);
    const best = rank(outcome.designs)[0];
    if (best?.design.feasible) {
      return { field: attempt.field, value: attempt.value, description: attempt.description, design: summary(best.design, `feasible with ${attempt.description}`) };
    }
  }
  return undefined;
}

function describeAssumptions(spec: BldcSpec, input: BldcInput): string[] {
  const t = spec.targets;
  const frame = spec.frame;
  const out = [
    input.supplyType === 'dc'
      ? `DC bus ${spec.dcBusV.toFixed(0)} V as given`
      : `DC bus ${spec.dcBusV.toFixed(0)} V = 1.35 × ${input.supplyVoltageV} V line voltage less ${(DC_BUS_LOAD_DROP * 100).toFixed(0)} % drop under load (six-pulse diode rectifier; Mohan et al.)`,
    frame.system === 'free'
      ? `free limits: stator outer diameter ≤ ${frame.maxStatorOuterDiameterMm} mm, stack ≤ ${frame.maxStackLengthMm} mm`
      : `frame ${frame.system} ${frame.designation}${input.frame === undefined ? ' (standard frame of the induction motor of this rating, EN 50347)' : ''}: stator outer diameter ≤ ${frame.maxStatorOuterDiameterMm.toFixed(0)} mm (${STATOR_DIAMETER_PER_SHAFT_HEIGHT} × shaft height), stack ≤ ${frame.maxStackLengthMm.toFixed(0)} mm (${STACK_LENGTH_PER_FOOT_SPACING} × foot-hole spacing) — common practice estimates`,
    `magnet ${spec.magnet.name} at ${t.magnetTemperatureC} °C (${spec.magnet.source})`,
    `lamination ${spec.steel.name} (${spec.steel.source})`,
    `targets: air-gap ${t.airgapFluxDensityT} T, tooth ${t.toothFluxDensityT} T, yoke ${t.yokeFluxDensityT} T, current density ≤ ${t.currentDensityAPerMm2} A/mm², net slot fill ${t.slotFill}, voltage margin ${t.voltageMarginPct} %, winding ${t.windingTemperatureC} °C, pole arc ${t.poleArcFraction}, current limit ${t.currentLimitFactor} × rated, demagnetisation margin ≥ ${t.minDemagnetisationMarginPct} %`,
    `drive: ${spec.drive}${spec.drive === 'six-step' ? ' (120° conduction, ideal rectangular currents)' : ' (sinusoidal currents in phase with the back-EMF)'}; cooling ${spec.cooling === 'tefc' ? 'totally enclosed fan-cooled' : 'natural'}; duty S1`,
    `objective: lowest ${OBJECTIVE_LABEL[spec.objective]}${spec.minEfficiencyPct !== undefined ? `, motor efficiency ≥ ${spec.minEfficiencyPct} %` : ''}`,
    'rotor iron losses neglected (synchronous field); no-load stator iron loss at rated speed; copper loss at DC resistance (no AC effect)',
    'part-load curve at rated speed with torque proportional to load; efficiency of motor and drive together; supply power factor of a diode front end with DC choke',
    'results are estimates for planning, not a design approval',
  ];
  return out;
}
