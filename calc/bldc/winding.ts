/**
 * Three-phase windings by the star of slots: which coil side lies in which slot, which phase and
 * which direction, with the winding factors of every space harmonic, symmetry and balance.
 *
 * References:
 * [1] J. Cros, P. Viarouge, "Synthesis of high performance PM motors with concentrated windings",
 *     IEEE Trans. Energy Conversion 17(2), 2002, pp. 248–253 (star of slots, tooth-coil tables).
 * [2] J. Pyrhönen, T. Jokinen, V. Hrabovcová, Design of Rotating Electrical Machines, 2nd ed.,
 *     Wiley 2014, ch. 2 (distribution and pitch factors, k_w = k_d·k_p).
 * [3] N. Bianchi, M. Dai Pré, "Use of the star of slots in designing fractional-slot single-layer
 *     synchronous motors", IEE Proc. Electr. Power Appl. 153(3), 2006 (feasibility, balance).
 */
import { CalcInputError } from '../errors.js';

export type PhaseName = 'A' | 'B' | 'C';

/** One coil: its go side and return side, the phase it belongs to and its connection sense. */
export interface Coil {
  /** Index of the coil [-]. */
  index: number;
  phase: PhaseName;
  /** +1: current enters at the go slot; −1: the coil is connected reversed. */
  direction: 1 | -1;
  /** Slot of the go side [-], 0-based. */
  goSlot: number;
  /** Slot of the return side [-], 0-based. */
  returnSlot: number;
}

/** One coil side as seen in a slot (what the winding table and the cross-section draw). */
export interface SlotSide {
  slot: number;
  /** 0 = top (towards the air gap) or left, 1 = bottom or right; 0 for a single layer. */
  layer: number;
  phase: PhaseName;
  /** +1 current out of the page (positive), −1 into it. */
  direction: 1 | -1;
  coil: number;
}

/** Winding factor of one space harmonic. */
export interface WindingHarmonic {
  /** Mechanical harmonic order ν [-] (cycles around the air gap). */
  mechanicalOrder: number;
  /** Order relative to the rotor's pole pairs ν/p [-] (1 = working harmonic; may be fractional). */
  electricalOrder: number;
  /** Winding factor |k_wν| [-]. */
  factor: number;
}

export interface WindingLayout {
  slots: number;
  poles: number;
  layers: 1 | 2;
  /** Coil pitch [slots]. */
  coilPitch: number;
  /** Slots per pole and phase q = Q/(2p·m) [-]. */
  slotsPerPoleAndPhase: number;
  /** Fundamental winding factor k_w1 [-]. */
  windingFactor: number;
  /** Distribution (or "star") part of k_w1 [-]. */
  distributionFactor: number;
  /** Pitch part of k_w1 [-]. */
  pitchFactor: number;
  /** Machine periodicity t = gcd(Q, p) [-]: the winding repeats t times around the air gap. */
  periodicity: number;
  /** True when the three phases have equal magnitudes and are 120° apart. */
  balanced: boolean;
  /** Coils of one phase [-] (coils per phase, all in series for one parallel path). */
  coilsPerPhase: number;
  /** Largest number of parallel paths the symmetry allows [-]. */
  maxParallelPaths: number;
  /** Least common multiple of Q and 2p [-]: the cogging-torque periods per revolution. */
  coggingPeriodsPerRevolution: number;
  harmonics: WindingHarmonic[];
  coils: Coil[];
  sides: SlotSide[];
}

/** Phase belts of the star of slots in 60° sectors, in order of increasing phasor angle. */
const SECTOR_PHASES: ReadonlyArray<{ phase: PhaseName; sign: 1 | -1 }> = [
  { phase: 'A', sign: 1 },
  { phase: 'C', sign: -1 },
  { phase: 'B', sign: 1 },
  { phase: 'A', sign: -1 },
  { phase: 'C', sign: 1 },
  { phase: 'B', sign: -1 },
];

/** Highest electrical harmonic order listed in `harmonics` [-]. */
export const WINDING_HARMONIC_MAX_ELECTRICAL_ORDER = 13;

const PHASES: PhaseName[] = ['A', 'B', 'C'];

function gcd(a: number, b: number): number {
  let x = Math.abs(a);
  let y = Math.abs(b);
  while (y) [x, y] = [y, x % y];
  return x;
}

/**
 * Complex winding factor of one phase for mechanical harmonic order ν: the normalised sum of the
 * EMF phasors of its coil sides, Σ dir·(e^{jνθ_go} − e^{jνθ_ret}) / (2·coils) (star of slots, [1]).
 * @param coils the phase's coils
 * @param slots number of slots Q [-]
 * @param order mechanical harmonic order ν [-]
 * @returns [real, imaginary] of k_wν [-]
 */
export function phaseWindingPhasor(coils: readonly Coil[], slots: number, order: number): [number, number] {
  let re = 0;
  let im = 0;
  const step = (2 * Math.PI * order) / slots;
  for (const coil of coils) {
    re += coil.direction * (Math.cos(step * coil.goSlot) - Math.cos(step * coil.returnSlot));
    im += coil.direction * (Math.sin(step * coil.goSlot) - Math.sin(step * coil.returnSlot));
  }
  const n = 2 * coils.length;
  return [re / n, im / n];
}

function assignCoils(slots: number, polePairs: number, pitch: number, offsetRad: number): Coil[] {
  const coils: Coil[] = [];
  for (let k = 0; k < slots; k += 1) {
    const go = (2 * Math.PI * polePairs * k) / slots;
    const ret = (2 * Math.PI * polePairs * (k + pitch)) / slots;
    // Phasor of the coil's EMF: e^{jα_go} − e^{jα_ret}; its angle picks the 60° phase belt ([1]).
    const angle = Math.atan2(Math.sin(go) - Math.sin(ret), Math.cos(go) - Math.cos(ret));
    const turns = (angle - offsetRad + Math.PI / 6) / (Math.PI / 3);
    const sector = ((Math.floor(turns + 1e-9) % 6) + 6) % 6;
    const belt = SECTOR_PHASES[sector] ?? { phase: 'A' as PhaseName, sign: 1 as const };
    coils.push({ index: k, phase: belt.phase, direction: belt.sign, goSlot: k, returnSlot: (k + pitch) % slots });
  }
  return coils;
}

function magnitude([re, im]: [number, number]): number {
  return Math.hypot(re, im);
}

function isBalanced(coils: readonly Coil[], slots: number, polePairs: number): boolean {
  const byPhase = PHASES.map((phase) => coils.filter((coil) => coil.phase === phase));
  if (byPhase.some((list) => list.length !== byPhase[0]?.length || list.length === 0)) return false;
  const phasors = byPhase.map((list) => phaseWindingPhasor(list, slots, polePairs));
  const mags = phasors.map(magnitude);
  const a = mags[0] ?? 0;
  if (a < 1e-6 || mags.some((m) => Math.abs(m - a) > 1e-6)) return false;
  const angles = phasors.map(([re, im]) => Math.atan2(im, re));
  const ab = ((((angles[0] ?? 0) - (angles[1] ?? 0)) % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
  const ac = ((((angles[0] ?? 0) - (angles[2] ?? 0)) % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
  const third = (2 * Math.PI) / 3;
  // Phase sequence A, B, C either way round is fine (reversing rotation swaps B and C).
  return (Math.abs(ab - third) < 1e-6 && Math.abs(ac - 2 * third) < 1e-6) || (Math.abs(ab - 2 * third) < 1e-6 && Math.abs(ac - third) < 1e-6);
}

/**
 * Lays out a three-phase winding by the star of slots and returns its winding factors.
 *
 * Double layer: one coil per slot (coil k from slot k to slot k+y); single layer: every other
 * tooth coil (y = 1) or the positively connected coils of the full-pitch winding. Each coil's EMF
 * phasor e^{jpθ_go} − e^{jpθ_ret} falls in one of six 60° phase belts (+A, −C, +B, −A, +C, −B);
 * the belt origin is rotated over a few positions and the balanced layout with the highest k_w1 is
 * kept. k_wν = |Σ dir·(e^{jνθ_go} − e^{jνθ_ret})| / (2·coils per phase), Eq. (2.x) style of [1],[2].
 *
 * @param slots number of stator slots Q [-], 3 to 240
 * @param poles number of rotor poles 2p [-], even, 2 to 120
 * @param layers 1 or 2 [-]
 * @param coilPitch coil pitch y [slots]; default max(1, round(Q/2p)) (tooth coil or full pitch)
 * @returns layout, k_w1 with its distribution and pitch parts, harmonics, balance, symmetry
 * @throws CalcInputError when the numbers are not whole, out of range, or the winding cannot be laid
 * References: [1] Cros & Viarouge 2002; [2] Pyrhönen et al. 2014, ch. 2; [3] Bianchi & Dai Pré 2006.
 */
export function windingLayout(slots: number, poles: number, layers: 1 | 2 = 2, coilPitch?: number): WindingLayout {
  if (!Number.isInteger(slots) || slots < 3 || slots > 240) throw new CalcInputError('slots', 'must be a whole number between 3 and 240');
  if (!Number.isInteger(poles) || poles < 2 || poles > 120 || poles % 2 !== 0) throw new CalcInputError('poles', 'must be an even whole number between 2 and 120');
  if (layers !== 1 && layers !== 2) throw new CalcInputError('layers', 'must be 1 or 2');
  if (slots % 3 !== 0) throw new CalcInputError('slots', 'must be a multiple of 3 for a three-phase winding');
  const polePairs = poles / 2;
  if (slots === poles) throw new CalcInputError('slots', 'must differ from the number of poles (k_w1 = 0 for Q = 2p)');
  const pitch = coilPitch ?? Math.max(1, Math.round(slots / poles));
  if (!Number.isInteger(pitch) || pitch < 1 || pitch > slots / 2) throw new CalcInputError('coilPitch', `must be a whole number between 1 and ${Math.floor(slots / 2)}`);

  const t = gcd(slots, polePairs);
  const spokes = slots / t;
  let best: { coils: Coil[]; kw: number } | undefined;
  for (let i = 0; i < 4; i += 1) {
    const offset = (i * Math.PI) / spokes / 2;
    let coils = assignCoils(slots, polePairs, pitch, offset);
    if (layers === 1) coils = singleLayerCoils(coils, slots, pitch);
    if (coils.length === 0 || !isBalanced(coils, slots, polePairs)) continue;
    const kw = magnitude(phaseWindingPhasor(coils.filter((c) => c.phase === 'A'), slots, polePairs));
    if (!best || kw > best.kw + 1e-12) best = { coils, kw };
  }
  if (layers === 1 && !best) throw new CalcInputError('layers', `single layer gives no balanced winding for ${slots} slots / ${poles} poles with pitch ${pitch}`);
  const coils = orderPhases(best?.coils ?? assignCoils(slots, polePairs, pitch, 0), slots, polePairs);
  const phaseA = coils.filter((coil) => coil.phase === 'A');
  const balanced = best !== undefined;
  const windingFactor = best?.kw ?? magnitude(phaseWindingPhasor(phaseA, slots, polePairs));
  // Pitch factor of one coil for the working harmonic, Eq. k_p = sin(y·p·π/Q) of [2].
  const pitchFactor = Math.abs(Math.sin((pitch * polePairs * Math.PI) / slots));
  const distributionFactor = pitchFactor > 1e-12 ? windingFactor / pitchFactor : 0;

  const harmonics: WindingHarmonic[] = [];
  const maxOrder = polePairs * WINDING_HARMONIC_MAX_ELECTRICAL_ORDER;
  for (let order = 1; order <= maxOrder; order += 1) {
    const factor = magnitude(phaseWindingPhasor(phaseA, slots, order));
    if (factor > 1e-9) harmonics.push({ mechanicalOrder: order, electricalOrder: order / polePairs, factor });
  }

  const sides: SlotSide[] = [];
  const occupancy = new Array<number>(slots).fill(0);
  for (const coil of coils) {
    const goLayer = occupancy[coil.goSlot] ?? 0;
    occupancy[coil.goSlot] = goLayer + 1;
    sides.push({ slot: coil.goSlot, layer: layers === 1 ? 0 : goLayer, phase: coil.phase, direction: coil.direction, coil: coil.index });
    const retLayer = occupancy[coil.returnSlot] ?? 0;
    occupancy[coil.returnSlot] = retLayer + 1;
    sides.push({ slot: coil.returnSlot, layer: layers === 1 ? 0 : retLayer, phase: coil.phase, direction: coil.direction === 1 ? -1 : 1, coil: coil.index });
  }
  sides.sort((a, b) => a.slot - b.slot || a.layer - b.layer);

  // Parallel paths: the coils of a phase split into t identical groups (2t for a double layer
  // winding whose half-groups are antiperiodic) — [3].
  const antiperiodic = (slots / t) % 2 === 0 && (polePairs / t) % 2 === 1;
  const maxParallelPaths = layers === 2 && antiperiodic ? 2 * t : t;

  return {
    slots,
    poles,
    layers,
    coilPitch: pitch,
    slotsPerPoleAndPhase: slots / (poles * 3),
    windingFactor,
    distributionFactor,
    pitchFactor,
    periodicity: t,
    balanced,
    coilsPerPhase: phaseA.length,
    maxParallelPaths,
    coggingPeriodsPerRevolution: (slots * poles) / gcd(slots, poles),
    harmonics,
    coils,
    sides,
  };
}

/**
 * Names the phases so that B lags A and C lags B by 120° electrical for a rotor turning towards
 * increasing slot numbers (the EMF of a coil side at θ_k peaks when the rotor d-axis passes θ_k).
 */
function orderPhases(coils: Coil[], slots: number, polePairs: number): Coil[] {
  const angle = (phase: PhaseName) => {
    const [re, im] = phaseWindingPhasor(coils.filter((coil) => coil.phase === phase), slots, polePairs);
    return Math.atan2(im, re);
  };
  const lag = (((angle('B') - angle('A')) % (2 * Math.PI)) + 2 * Math.PI) % (2 * Math.PI);
  if (Math.abs(lag - (2 * Math.PI) / 3) < 1e-6) return coils;
  return coils.map((coil) => (coil.phase === 'A' ? coil : { ...coil, phase: coil.phase === 'B' ? 'C' : 'B' }));
}

function singleLayerCoils(doubleLayer: readonly Coil[], slots: number, pitch: number): Coil[] {
  if (pitch === 1) {
    // Tooth coils on every other tooth: needs an even slot count.
    if (slots % 2 !== 0) return [];
    return doubleLayer.filter((coil) => coil.index % 2 === 0);
  }
  // Full-pitch lap winding: the positively connected coils fill each slot exactly once.
  const kept = doubleLayer.filter((coil) => coil.direction === 1);
  const used = new Set<number>();
  for (const coil of kept) {
    if (used.has(coil.goSlot) || used.has(coil.returnSlot)) return [];
    used.add(coil.goSlot);
    used.add(coil.returnSlot);
  }
  return used.size === slots ? kept : [];
}
