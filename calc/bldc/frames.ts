/**
 * Frames: the space an induction motor's frame offers to the BLDC that replaces it.
 *
 * How the limits are derived (common practice estimates, stated in every result's assumptions):
 * - largest stator outer diameter = 1.6 × shaft height H (IEC frames) — the lamination of a
 *   totally enclosed fan-cooled frame leaves room for the housing and its fins below 2H;
 * - largest stack length = 0.9 × the foot-hole spacing B of the frame (IEC 60072-1 dimension B,
 *   NEMA MG 1 dimension 2F), since the housing length follows that spacing.
 * NEMA shaft height D = (first two digits of the frame number)/4 inches (NEMA MG 1 §4.2.1 rule).
 *
 * References:
 * [1] IEC 60072-1: shaft heights and foot-hole spacings (values from memory, REFERENCES.md §4).
 * [2] EN 50347 Tables 2–3: standard power-to-frame assignment (REFERENCES.md §4, from memory);
 *     315L is beyond the §4 table (value from memory).
 * [3] NEMA MG 1 Part 4: T-frame dimensions D and 2F (values from memory).
 */
import { CalcInputError } from '../errors.js';

export interface FrameLimits {
  system: 'IEC' | 'NEMA' | 'free';
  designation: string;
  /** Shaft height [mm]; 0 for free limits. */
  shaftHeightMm: number;
  /** Largest stator outer diameter [mm]. */
  maxStatorOuterDiameterMm: number;
  /** Largest stack length [mm]. */
  maxStackLengthMm: number;
}

/** Stator outer diameter allowance per mm of shaft height [-] (common practice, no source). */
export const STATOR_DIAMETER_PER_SHAFT_HEIGHT = 1.6;
/** Stack length allowance per mm of foot-hole spacing [-] (common practice, no source). */
export const STACK_LENGTH_PER_FOOT_SPACING = 0.9;

/** IEC frames [1]: designation → [shaft height H, foot-hole spacing B] in mm (from memory). */
const IEC_FRAMES: ReadonlyArray<[string, number, number]> = [
  ['56M', 56, 71], ['63M', 63, 80], ['71M', 71, 90], ['80M', 80, 100], ['90S', 90, 100], ['90L', 90, 125],
  ['100L', 100, 140], ['112M', 112, 140], ['132S', 132, 140], ['132M', 132, 178], ['160M', 160, 210],
  ['160L', 160, 254], ['180M', 180, 241], ['180L', 180, 279], ['200L', 200, 305], ['225S', 225, 286],
  ['225M', 225, 311], ['250M', 250, 349], ['280S', 280, 368], ['280M', 280, 419], ['315S', 315, 406],
  ['315M', 315, 457], ['315L', 315, 508], ['355M', 355, 560], ['355L', 355, 630], ['400M', 400, 630], ['400L', 400, 710],
];

/** NEMA T frames [3]: designation → 2F foot-hole spacing [inch] (from memory). */
const NEMA_FRAMES: ReadonlyArray<[string, number]> = [
  ['143T', 4.0], ['145T', 5.0], ['182T', 4.5], ['184T', 5.5], ['213T', 5.5], ['215T', 7.0], ['254T', 8.25],
  ['256T', 10.0], ['284T', 9.5], ['286T', 11.0], ['324T', 10.5], ['326T', 12.0], ['364T', 11.25], ['365T', 12.25],
  ['404T', 12.25], ['405T', 13.75], ['444T', 14.5], ['445T', 16.5],
];

const INCH_MM = 25.4;

function iecLimits(designation: string, height: number, footSpacing: number): FrameLimits {
  return {
    system: 'IEC',
    designation,
    shaftHeightMm: height,
    maxStatorOuterDiameterMm: STATOR_DIAMETER_PER_SHAFT_HEIGHT * height,
    maxStackLengthMm: STACK_LENGTH_PER_FOOT_SPACING * footSpacing,
  };
}

function nemaLimits(designation: string, footSpacingInch: number): FrameLimits {
  const height = (Number(designation.slice(0, 2)) / 4) * INCH_MM;
  return {
    system: 'NEMA',
    designation,
    shaftHeightMm: height,
    maxStatorOuterDiameterMm: STATOR_DIAMETER_PER_SHAFT_HEIGHT * height,
    maxStackLengthMm: STACK_LENGTH_PER_FOOT_SPACING * footSpacingInch * INCH_MM,
  };
}

/** Every frame known, IEC then NEMA, each in increasing size. */
export function listFrames(): FrameLimits[] {
  return [...IEC_FRAMES.map(([d, h, b]) => iecLimits(d, h, b)), ...NEMA_FRAMES.map(([d, f]) => nemaLimits(d, f))];
}

/**
 * Limits of a frame given as "132S", "IEC 132M", "160L", "NEMA 184T" or "184T".
 * @param designation frame designation
 * @returns the frame's largest stator outer diameter and stack length [mm]
 * @throws CalcInputError ("frame") for an unknown designation
 */
export function frameLimits(designation: string): FrameLimits {
  const cleaned = designation.trim().toUpperCase().replace(/^(IEC|NEMA)\s*/, '');
  const iec = IEC_FRAMES.find(([d]) => d === cleaned);
  if (iec) return iecLimits(iec[0], iec[1], iec[2]);
  const nema = NEMA_FRAMES.find(([d]) => d === cleaned);
  if (nema) return nemaLimits(nema[0], nema[1]);
  throw new CalcInputError('frame', 'must be an IEC frame such as "132S" or a NEMA T frame such as "184T"');
}

/** The next larger frame of the same system (for the nearest feasible alternative), if any. */
export function nextLargerFrame(frame: FrameLimits): FrameLimits | undefined {
  if (frame.system === 'free') return undefined;
  const same = listFrames().filter((f) => f.system === frame.system);
  return same.find((f) => f.maxStatorOuterDiameterMm * f.maxStackLengthMm > frame.maxStatorOuterDiameterMm * frame.maxStackLengthMm + 1e-9 && f.shaftHeightMm >= frame.shaftHeightMm);
}

/**
 * Standard IEC frame of a totally enclosed fan-cooled 50 Hz cage motor of a rating [2]
 * (REFERENCES.md §4; 315L from memory).
 */
const STANDARD_FRAME_TABLE: ReadonlyArray<[string, number[], number[], number[]]> = [
  ['71M', [0.37, 0.55], [0.25, 0.37], [0.18, 0.25]],
  ['80M', [0.75, 1.1], [0.55, 0.75], [0.37, 0.55]],
  ['90S', [1.5], [1.1], [0.75]],
  ['90L', [2.2], [1.5], [1.1]],
  ['100L', [3], [2.2, 3], [1.5]],
  ['112M', [4], [4], [2.2]],
  ['132S', [5.5, 7.5], [5.5], [3]],
  ['132M', [], [7.5], [4, 5.5]],
  ['160M', [11, 15], [11], [7.5]],
  ['160L', [18.5], [15], [11]],
  ['180M', [22], [18.5], []],
  ['180L', [], [22], [15]],
  ['200L', [30, 37], [30], [18.5, 22]],
  ['225S', [], [37], []],
  ['225M', [45], [45], [30]],
  ['250M', [55], [55], [37]],
  ['280S', [75], [75], [45]],
  ['280M', [90], [90], [55]],
  ['315S', [110], [110], [75]],
  ['315M', [132], [132], [90]],
  ['315L', [160, 200], [160, 200], [110, 132, 160]],
];

/**
 * The standard IEC frame of an induction motor of this rating and pole count [2], or undefined
 * when the rating is not in the table.
 * @param ratedPowerKw rated output [kW]
 * @param poles 2, 4 or 6 [-]
 */
export function standardFrameFor(ratedPowerKw: number, poles: number): string | undefined {
  const column = poles === 2 ? 1 : poles === 4 ? 2 : poles === 6 ? 3 : 0;
  if (column === 0) return undefined;
  const row = STANDARD_FRAME_TABLE.find((entry) => (entry[column] as number[]).some((kw) => Math.abs(kw - ratedPowerKw) < 1e-9));
  return row?.[0];
}
