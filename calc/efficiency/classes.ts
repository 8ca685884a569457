/**
 * Efficiency classes of line-operated cage induction motors: IEC 60034-30-1 IE1–IE4 (50 and 60 Hz),
 * IE5 by the 20 %-lower-losses rule, NEMA MG 1 levels for 60 Hz motors rated in hp, and the default
 * for an old motor of unknown class.
 *
 * References:
 * [1] IEC 60034-30-1:2014, Rotating electrical machines – Part 30-1: Efficiency classes of line
 *     operated AC motors (IE code); interpolation formula and coefficients as reproduced in
 *     EU Regulation 2019/1781 Annex I and UK SI 2021/745 Schedule 16, Tables 27 and 28.
 * [2] IEC TS 60034-30-2:2016 (IE5 for variable-speed motors): table not at hand; the working rule
 *     "IE5 has 20 % lower losses than IE4" is used instead and said so in every `source`.
 * [3] NEMA MG 1 Table 12-12 (NEMA Premium) = 10 CFR 431.25 Table (motors made after 2016), and
 *     NEMA MG 1 Table 12-11 (Energy Efficient) = 10 CFR 431.25(a) (EPAct 1992 levels).
 * [4] 10 CFR 431.25(b) and UK SI 2021/745 Sch. 16 para 5: a rating between two listed ratings takes
 *     the higher rating's value at or above the midpoint, the lower one's below it.
 */
import { CalcInputError, requireInRange } from '../errors.js';

export type IeClass = 'IE1' | 'IE2' | 'IE3' | 'IE4' | 'IE5';
export type Poles = 2 | 4 | 6 | 8;
export type Enclosure = 'enclosed' | 'open';
export type NemaLevel = 'nema-premium' | 'epact';

/** A class value with where it came from. */
export interface ClassEfficiency {
  /** Nominal full-load efficiency [%], rounded half-up to 0.1 % as the standard tabulates it. */
  efficiencyPct: number;
  /** The standard, table and rule that gave the value. */
  source: string;
}

export const IE_CLASSES: readonly IeClass[] = ['IE1', 'IE2', 'IE3', 'IE4', 'IE5'];
export const POLES: readonly Poles[] = [2, 4, 6, 8];

/** Lowest and highest rated power IEC 60034-30-1 covers [kW] (scope of [1]). */
export const IEC_MIN_RATED_POWER_KW = 0.12;
export const IEC_MAX_RATED_POWER_KW = 1000;
/** Above this rating the 200 kW value holds up to 1000 kW [kW] ([1], value from memory). */
export const IEC_FORMULA_MAX_KW = 200;
/** Table 28 of [1] starts here; below it Table 27 (0.12–0.55 kW) is used [kW]. */
export const IEC_LARGE_TABLE_MIN_KW = 0.75;

/** IE5 losses as a fraction of IE4 losses at the same output [-] ([2], rule "20 % lower losses"). */
export const IE5_LOSS_RATIO_TO_IE4 = 0.8;

/**
 * Losses of an old motor of unknown class relative to IE1 losses at the same rating [-]: 15 % more
 * than IE1, i.e. 1.5–3 points below IE1 (pre-1998 "standard" motors fell below today's IE1;
 * common practice, no source). Used by `unknownClassEfficiencyPct`.
 */
export const UNKNOWN_CLASS_LOSS_FACTOR_TO_IE1 = 1.15;

/** [A, B, C, D] of η = A·x³ + B·x² + C·x + D, x = log10(P/1 kW). */
type Coefficients = readonly [number, number, number, number];

/** Table 28 of [1] (0.75–200 kW); IE1 2 and 4 poles from memory (REFERENCES.md section 1). */
const TABLE_28: Partial<Record<IeClass, Partial<Record<Poles, Coefficients>>>> = {
  IE1: {
    2: [0.5234, -5.0499, 17.418, 74.3171],
    4: [0.5234, -5.0499, 17.418, 74.3171],
  },
  IE2: {
    2: [0.2972, -3.3454, 13.0651, 79.077],
    4: [0.0278, -1.9247, 10.4395, 80.9761],
    6: [0.0148, -2.4978, 13.247, 77.5603],
    8: [2.1311, -12.029, 26.719, 69.735],
  },
  IE3: {
    2: [0.3569, -3.3076, 11.6108, 82.2503],
    4: [0.0773, -1.8951, 9.2984, 83.7025],
    6: [0.1252, -2.613, 11.9963, 80.4769],
    8: [0.7189, -5.1678, 15.705, 77.074],
  },
  IE4: {
    2: [0.34, -3.0479, 10.293, 84.8208],
    4: [0.2412, -2.3608, 8.446, 86.8321],
    6: [0.3598, -3.2107, 10.7933, 84.107],
    8: [0.6556, -4.7229, 13.977, 80.247],
  },
};

/** Table 27 of [1] (0.12–0.55 kW). */
const TABLE_27: Partial<Record<IeClass, Record<Poles, Coefficients>>> = {
  IE2: {
    2: [22.4864, 27.7603, 37.8091, 82.458],
    4: [17.2751, 23.978, 35.5822, 84.9935],
    6: [-15.9218, -30.258, 16.6861, 79.1838],
    8: [6.4855, 9.4748, 36.852, 70.762],
  },
  IE3: {
    2: [6.8532, 6.2006, 25.1317, 84.0392],
    4: [7.6356, 4.8236, 21.0903, 86.0998],
    6: [-17.361, -44.538, -3.0554, 79.1318],
    8: [-0.5896, -25.526, 4.2884, 75.831],
  },
  IE4: {
    2: [-8.8538, -20.3352, 8.9002, 85.0641],
    4: [8.432, 2.6888, 14.6236, 87.6153],
    6: [-13.0355, -36.9497, -4.3621, 82.0009],
    8: [-4.9735, -21.453, 2.6653, 79.055],
  },
};

/** Rounds half-up to 0.1 % once, from the unrounded value (the tables sit close to boundaries). */
export function roundHalfUpTenth(value: number): number {
  // The 1e-9 guards against a product like 86.05 being stored as 86.04999999999.
  return Math.floor(value * 10 + 0.5 + 1e-9) / 10;
}

function polynomial(c: Coefficients, ratedPowerKw: number): number {
  const x = Math.log10(ratedPowerKw);
  return ((c[0] * x + c[1]) * x + c[2]) * x + c[3]; // Interpolation formula of [1], Horner form
}

/** Efficiency [-] from losses per unit output [-], and back. */
const lossesPerOutput = (efficiencyPct: number): number => 100 / efficiencyPct - 1;
const efficiencyFromLosses = (losses: number): number => 100 / (1 + losses);

/**
 * Published IE1 values for 6 poles, 50 Hz, 0.75–11 kW [%] (IEC 60034-30-1 Table 2 as quoted in
 * REFERENCES.md section 1); the IE1 coefficients for 6 and 8 poles were not at hand.
 */
const IE1_6_POLE_PUBLISHED: readonly (readonly [number, number])[] = [
  [0.75, 70.0], [1.1, 72.9], [1.5, 75.2], [2.2, 77.7], [3, 79.7], [4, 81.4], [5.5, 83.1], [7.5, 84.7], [11, 86.4],
];

/**
 * IE1 losses / IE2 losses at the same rating [-] where no IE1 formula is at hand: for 2 and 4 poles
 * below 0.75 kW, the ratio at 0.75 kW; for 6 and 8 poles, the ratio of the published 6-pole IE1
 * values to the IE2 formula, interpolated linearly in log10(P) and held beyond 0.75–11 kW.
 * Statorline's derivation, no source; the 8-pole use of the 6-pole ratio is an assumption.
 */
function ie1ToIe2LossRatio(ratedPowerKw: number, poles: Poles): number {
  if (poles === 2 || poles === 4) {
    return lossesPerOutput(iec50HzUnroundedPct(IEC_LARGE_TABLE_MIN_KW, poles, 'IE1')) / lossesPerOutput(iec50HzUnroundedPct(IEC_LARGE_TABLE_MIN_KW, poles, 'IE2'));
  }
  const ratioAt = ([kw, pct]: readonly [number, number]): number => lossesPerOutput(pct) / lossesPerOutput(iec50HzUnroundedPct(kw, 6, 'IE2'));
  const first = IE1_6_POLE_PUBLISHED[0]!;
  const last = IE1_6_POLE_PUBLISHED[IE1_6_POLE_PUBLISHED.length - 1]!;
  if (ratedPowerKw <= first[0]) return ratioAt(first);
  if (ratedPowerKw >= last[0]) return ratioAt(last);
  let index = 1;
  while (IE1_6_POLE_PUBLISHED[index]![0] < ratedPowerKw) index += 1;
  const lower = IE1_6_POLE_PUBLISHED[index - 1]!;
  const upper = IE1_6_POLE_PUBLISHED[index]!;
  const weight = Math.log10(ratedPowerKw / lower[0]) / Math.log10(upper[0] / lower[0]);
  return ratioAt(lower) + weight * (ratioAt(upper) - ratioAt(lower));
}

/**
 * The unrounded 50 Hz value of [1] for IE1–IE4. IE1 has a formula here for 2 and 4 poles at
 * 0.75–200 kW only (coefficients from memory, they reproduce the published values); elsewhere
 * IE1 losses = IE2 losses × `ie1ToIe2LossRatio`.
 */
function iec50HzUnroundedPct(ratedPowerKw: number, poles: Poles, ieClass: Exclude<IeClass, 'IE5'>): number {
  const power = Math.min(ratedPowerKw, IEC_FORMULA_MAX_KW);
  if (ieClass === 'IE1') {
    const direct = TABLE_28.IE1?.[poles];
    if (direct && power >= IEC_LARGE_TABLE_MIN_KW) return polynomial(direct, power);
    return efficiencyFromLosses(lossesPerOutput(iec50HzUnroundedPct(power, poles, 'IE2')) * ie1ToIe2LossRatio(power, poles));
  }
  const table = power >= IEC_LARGE_TABLE_MIN_KW ? TABLE_28 : TABLE_27;
  // Tables 27 and 28 hold IE2–IE4 for every pole number; poles and class were checked by the caller.
  return polynomial(table[ieClass]![poles]!, power);
}

/** NEMA hp ratings of [3] and their standard kW equivalents. */
const NEMA_HP = [1, 1.5, 2, 3, 5, 7.5, 10, 15, 20, 25, 30, 40, 50, 60, 75, 100, 125, 150, 200] as const;
const NEMA_KW = [0.75, 1.1, 1.5, 2.2, 3.7, 5.5, 7.5, 11, 15, 18.5, 22, 30, 37, 45, 55, 75, 90, 110, 150] as const;

type NemaColumns = Partial<Record<`${Enclosure}-${Poles}`, readonly (number | null)[]>>;

/** NEMA Premium, MG 1 Table 12-12 level = 10 CFR 431.25 (REFERENCES.md 2.1); 8 poles to 30 hp. */
const NEMA_PREMIUM: NemaColumns = {
  'enclosed-2': [77.0, 84.0, 85.5, 86.5, 88.5, 89.5, 90.2, 91.0, 91.0, 91.7, 91.7, 92.4, 93.0, 93.6, 93.6, 94.1, 95.0, 95.0, 95.4],
  'enclosed-4': [85.5, 86.5, 86.5, 89.5, 89.5, 91.7, 91.7, 92.4, 93.0, 93.6, 93.6, 94.1, 94.5, 95.0, 95.4, 95.4, 95.4, 95.8, 96.2],
  'enclosed-6': [82.5, 87.5, 88.5, 89.5, 89.5, 91.0, 91.0, 91.7, 91.7, 93.0, 93.0, 94.1, 94.1, 94.5, 94.5, 95.0, 95.0, 95.8, 95.8],
  'enclosed-8': [75.5, 78.5, 84.0, 85.5, 86.5, 86.5, 89.5, 89.5, 90.2, 90.2, 91.7],
  'open-2': [77.0, 84.0, 85.5, 85.5, 86.5, 88.5, 89.5, 90.2, 91.0, 91.7, 91.7, 92.4, 93.0, 93.6, 93.6, 93.6, 94.1, 94.1, 95.0],
  'open-4': [85.5, 86.5, 86.5, 89.5, 89.5, 91.0, 91.7, 93.0, 93.0, 93.6, 94.1, 94.1, 94.5, 95.0, 95.0, 95.4, 95.4, 95.8, 95.8],
  'open-6': [82.5, 86.5, 87.5, 88.5, 89.5, 90.2, 91.7, 91.7, 92.4, 93.0, 93.6, 94.1, 94.1, 94.5, 94.5, 95.0, 95.0, 95.4, 95.4],
  'open-8': [75.5, 77.5, 86.5, 87.5, 88.5, 89.5, 90.2, 90.2, 91.0, 91.0, 91.7],
};

/** EPAct 1992 "Energy Efficient", MG 1 Table 12-11 level = 10 CFR 431.25(a) (REFERENCES.md 2.2). */
const NEMA_EPACT: NemaColumns = {
  'enclosed-2': [75.5, 82.5, 84.0, 85.5, 87.5, 88.5, 89.5, 90.2, 90.2, 91.0, 91.0, 91.7, 92.4, 93.0, 93.0, 93.6, 94.5, 94.5, 95.0],
  'enclosed-4': [82.5, 84.0, 84.0, 87.5, 87.5, 89.5, 89.5, 91.0, 91.0, 92.4, 92.4, 93.0, 93.0, 93.6, 94.1, 94.5, 94.5, 95.0, 95.0],
  'enclosed-6': [80.0, 85.5, 86.5, 87.5, 87.5, 89.5, 89.5, 90.2, 90.2, 91.7, 91.7, 93.0, 93.0, 93.6, 93.6, 94.1, 94.1, 95.0, 95.0],
  'open-2': [null, 82.5, 84.0, 84.0, 85.5, 87.5, 88.5, 89.5, 90.2, 91.0, 91.0, 91.7, 92.4, 93.0, 93.0, 93.0, 93.6, 93.6, 94.5],
  'open-4': [82.5, 84.0, 84.0, 86.5, 87.5, 88.5, 89.5, 91.0, 91.0, 91.7, 92.4, 93.0, 93.0, 93.6, 94.1, 94.1, 94.5, 95.0, 95.0],
  'open-6': [80.0, 84.0, 85.5, 86.5, 87.5, 88.5, 90.2, 90.2, 91.0, 91.7, 92.4, 93.0, 93.0, 93.6, 93.6, 94.1, 94.1, 94.5, 94.5],
};

/** Index of the listed rating that applies to `rating`, by the midpoint rule of [4]. */
function midpointIndex(listed: readonly number[], rating: number): number {
  let index = 0;
  while (index + 1 < listed.length && rating >= ((listed[index] ?? 0) + (listed[index + 1] ?? 0)) / 2) index += 1;
  return index;
}

/**
 * Nominal full-load efficiency of a 60 Hz motor rated in hp, at a NEMA MG 1 level.
 *
 * @param ratedPowerHp rated output [hp], 1–200 (8 poles: 1–30 hp for NEMA Premium; EPAct has no 8 poles)
 * @param poles 2, 4, 6 or 8 [-]
 * @param enclosure 'enclosed' (totally enclosed fan-cooled) or 'open' (open drip-proof)
 * @param level 'nema-premium' (MG 1 Table 12-12) or 'epact' (MG 1 Table 12-11)
 * @returns nominal efficiency [%] and its source. A rating between listed ones takes the listed
 *   rating chosen by the midpoint rule of 10 CFR 431.25(b).
 * References: [3], [4].
 */
export function nemaNominalEfficiencyPct(ratedPowerHp: number, poles: Poles, enclosure: Enclosure, level: NemaLevel): ClassEfficiency {
  requireInRange('ratedPowerHp', ratedPowerHp, 1, 200);
  const column = (level === 'nema-premium' ? NEMA_PREMIUM : NEMA_EPACT)[`${enclosure}-${poles}`];
  if (!column) throw new CalcInputError('poles', `has no ${level} value for ${poles} poles`);
  const index = midpointIndex(NEMA_HP, ratedPowerHp);
  const value = column[index];
  if (value === undefined || value === null) {
    throw new CalcInputError('ratedPowerHp', `has no ${level} value for ${ratedPowerHp} hp, ${poles} poles, ${enclosure}`);
  }
  const table = level === 'nema-premium' ? 'NEMA MG 1 Table 12-12 (10 CFR 431.25)' : 'NEMA MG 1 Table 12-11 (10 CFR 431.25(a))';
  return { efficiencyPct: value, source: `${table}, ${NEMA_HP[index]} hp ${enclosure}, ${poles} poles` };
}

/** IE5 from IE4 by the 20 %-lower-losses rule [2]: η5 = 1 / (1 + 0.8·(1/η4 − 1)). */
export function ie5FromIe4EfficiencyPct(ie4EfficiencyPct: number): number {
  return efficiencyFromLosses(IE5_LOSS_RATIO_TO_IE4 * lossesPerOutput(ie4EfficiencyPct));
}

/** True when the 60 Hz tables at hand (NEMA levels, 2/4/6 poles, 0.75–150 kW) cover the rating. */
function has60HzTable(ratedPowerKw: number, poles: Poles): boolean {
  return poles !== 8 && ratedPowerKw >= NEMA_KW[0] && ratedPowerKw <= NEMA_KW[NEMA_KW.length - 1]!;
}

/** The 60 Hz IE2 (EPAct level) or IE3 (NEMA Premium level) value, enclosed motors, rating in kW. */
function iec60HzTabulatedPct(ratedPowerKw: number, poles: Poles, ieClass: 'IE2' | 'IE3'): number {
  const column = (ieClass === 'IE3' ? NEMA_PREMIUM : NEMA_EPACT)[`enclosed-${poles}`];
  return column?.[midpointIndex(NEMA_KW, ratedPowerKw)] ?? Number.NaN;
}

/**
 * Minimum nominal efficiency of an efficiency class, the value a motor of that class is assumed to have.
 *
 * @param ratedPowerKw rated output [kW], 0.12–1000
 * @param poles 2, 4, 6 or 8 [-]
 * @param frequencyHz 50 or 60 [Hz]
 * @param ieClass 'IE1'…'IE5'
 * @returns nominal efficiency [%] rounded half-up to 0.1 %, and its source.
 *
 * 50 Hz: η = A·x³ + B·x² + C·x + D, x = log10(P/1 kW), Tables 27 (0.12–0.55 kW; also used up to
 * 0.75 kW) and 28 (0.75–200 kW) of [1]; the 200 kW value holds up to 1000 kW. 60 Hz, 2/4/6 poles,
 * 0.75–150 kW: IE2 = EPAct level and IE3 = NEMA Premium level of [3] (enclosed), which IEC 60034-30-1
 * adopts for 60 Hz, midpoint rule [4]; IE1 and IE4 at 60 Hz are the 50 Hz losses scaled by the
 * 60/50 Hz loss ratio of IE2 and IE3 respectively (Statorline's approximation, said in `source`).
 * Elsewhere at 60 Hz the 50 Hz value is used and said so. IE5: 20 % lower losses than IE4 [2].
 */
export function iecClassEfficiency(ratedPowerKw: number, poles: Poles, frequencyHz: number, ieClass: IeClass): ClassEfficiency {
  requireInRange('ratedPowerKw', ratedPowerKw, IEC_MIN_RATED_POWER_KW, IEC_MAX_RATED_POWER_KW);
  if (!POLES.includes(poles)) throw new CalcInputError('poles', 'must be 2, 4, 6 or 8');
  if (frequencyHz !== 50 && frequencyHz !== 60) throw new CalcInputError('frequencyHz', 'must be 50 or 60');
  if (!IE_CLASSES.includes(ieClass)) throw new CalcInputError('efficiencyClass', 'must be one of IE1, IE2, IE3, IE4, IE5');

  if (ieClass === 'IE5') {
    const ie4 = iecClassEfficiency(ratedPowerKw, poles, frequencyHz, 'IE4');
    return {
      efficiencyPct: roundHalfUpTenth(ie5FromIe4EfficiencyPct(ie4.efficiencyPct)),
      source: `IE5 as 20 % lower losses than IE4 (IEC TS 60034-30-2 table not at hand); IE4 from ${ie4.source}`,
    };
  }
  const table = ratedPowerKw >= IEC_LARGE_TABLE_MIN_KW ? 'Table 28' : 'Table 27';
  const above200 = ratedPowerKw > IEC_FORMULA_MAX_KW ? ', 200 kW value held above 200 kW' : '';
  const derivedIe1 = ieClass === 'IE1' && (poles > 4 || ratedPowerKw < IEC_LARGE_TABLE_MIN_KW) ? ', IE1 derived from IE2 by an IE1/IE2 loss ratio (Statorline)' : '';
  const fiftyHzSource = `IEC 60034-30-1:2014 interpolation formula, ${table} (EU 2019/1781)${above200}${derivedIe1}`;

  if (frequencyHz === 50) {
    return { efficiencyPct: roundHalfUpTenth(iec50HzUnroundedPct(ratedPowerKw, poles, ieClass)), source: fiftyHzSource };
  }
  if (!has60HzTable(ratedPowerKw, poles)) {
    return {
      efficiencyPct: roundHalfUpTenth(iec50HzUnroundedPct(ratedPowerKw, poles, ieClass)),
      source: `60 Hz table not at hand for this rating; 50 Hz value: ${fiftyHzSource}`,
    };
  }
  if (ieClass === 'IE2' || ieClass === 'IE3') {
    const level = ieClass === 'IE3' ? 'NEMA Premium, MG 1 Table 12-12' : 'EPAct, MG 1 Table 12-11';
    return {
      efficiencyPct: iec60HzTabulatedPct(ratedPowerKw, poles, ieClass),
      source: `IEC 60034-30-1 60 Hz ${ieClass} = ${level} level (enclosed, midpoint rule of 10 CFR 431.25(b))`,
    };
  }
  const anchor = ieClass === 'IE1' ? 'IE2' : 'IE3';
  const ratio = lossesPerOutput(iec60HzTabulatedPct(ratedPowerKw, poles, anchor)) / lossesPerOutput(roundHalfUpTenth(iec50HzUnroundedPct(ratedPowerKw, poles, anchor)));
  const scaled = efficiencyFromLosses(lossesPerOutput(iec50HzUnroundedPct(ratedPowerKw, poles, ieClass)) * ratio);
  return {
    efficiencyPct: roundHalfUpTenth(scaled),
    source: `60 Hz ${ieClass} approximated: 50 Hz ${ieClass} losses × (60 Hz/50 Hz ${anchor} loss ratio), Statorline's approximation; 50 Hz: ${fiftyHzSource}`,
  };
}

/**
 * Assumed efficiency of a motor whose class is unknown and that predates the class regime: IE1
 * losses × UNKNOWN_CLASS_LOSS_FACTOR_TO_IE1 (common practice, no source).
 *
 * @param ratedPowerKw rated output [kW]; @param poles [-]; @param frequencyHz [Hz]
 * @param lossFactor losses relative to IE1 [-], default UNKNOWN_CLASS_LOSS_FACTOR_TO_IE1
 * @returns efficiency [%] (rounded half-up to 0.1 %) and its source.
 */
export function unknownClassEfficiency(
  ratedPowerKw: number,
  poles: Poles,
  frequencyHz: number,
  lossFactor: number = UNKNOWN_CLASS_LOSS_FACTOR_TO_IE1,
): ClassEfficiency {
  requireInRange('unknownClassLossFactor', lossFactor, 1, 3);
  const ie1 = iecClassEfficiency(ratedPowerKw, poles, frequencyHz, 'IE1');
  return {
    efficiencyPct: roundHalfUpTenth(efficiencyFromLosses(lossesPerOutput(ie1.efficiencyPct) * lossFactor)),
    source: `unknown class: IE1 losses × ${lossFactor} (below IE1, common practice); IE1 from ${ie1.source}`,
  };
}

/** Entries kept by the class-efficiency memo before it starts afresh (bounds its memory). */
export const CLASS_MEMO_MAX_ENTRIES = 4096;

/** Memo of class values by rating [kW] → slot (poles, frequency, class); "U" slots hold the default unknown class. */
const classMemo = new Map<number, (ClassEfficiency | undefined)[]>();

const memoSlot = (poles: Poles, frequencyHz: number, ieClass: IeClass | 'unknown'): number =>
  (poles / 2 - 1) * 12 + (frequencyHz === 60 ? 6 : 0) + (ieClass === 'unknown' ? 5 : Number(ieClass.charCodeAt(2) - 49));

/**
 * `iecClassEfficiency`, memoised: the same value, shared and frozen, for a repeated (rating, poles,
 * frequency, class). Fleets use a few standard ratings, so an assessment of many motors computes each
 * class value once instead of once per motor and option (the source strings and the polynomials were
 * a visible share of `assess`). Pure: nothing but the memo's hit rate depends on earlier calls.
 *
 * @param ratedPowerKw [kW]; @param poles [-]; @param frequencyHz [Hz]; @param ieClass 'IE1'…'IE5'
 * @returns as `iecClassEfficiency` (frozen: do not mutate). Invalid input throws as it does.
 */
export function memoIecClassEfficiency(ratedPowerKw: number, poles: Poles, frequencyHz: number, ieClass: IeClass): ClassEfficiency {
  return memoised(ratedPowerKw, poles, frequencyHz, ieClass) ?? remember(ratedPowerKw, poles, frequencyHz, ieClass, iecClassEfficiency(ratedPowerKw, poles, frequencyHz, ieClass));
}

/**
 * `unknownClassEfficiency` with the default loss factor, memoised like `memoIecClassEfficiency`.
 *
 * @param ratedPowerKw [kW]; @param poles [-]; @param frequencyHz [Hz]
 * @returns as `unknownClassEfficiency(ratedPowerKw, poles, frequencyHz)` (frozen).
 */
export function memoUnknownClassEfficiency(ratedPowerKw: number, poles: Poles, frequencyHz: number): ClassEfficiency {
  return memoised(ratedPowerKw, poles, frequencyHz, 'unknown') ?? remember(ratedPowerKw, poles, frequencyHz, 'unknown', unknownClassEfficiency(ratedPowerKw, poles, frequencyHz));
}

function memoised(ratedPowerKw: number, poles: Poles, frequencyHz: number, ieClass: IeClass | 'unknown'): ClassEfficiency | undefined {
  if (frequencyHz !== 50 && frequencyHz !== 60) return undefined;
  if (poles !== 2 && poles !== 4 && poles !== 6 && poles !== 8) return undefined;
  return classMemo.get(ratedPowerKw)?.[memoSlot(poles, frequencyHz, ieClass)];
}

function remember(ratedPowerKw: number, poles: Poles, frequencyHz: number, ieClass: IeClass | 'unknown', value: ClassEfficiency): ClassEfficiency {
  let slots = classMemo.get(ratedPowerKw);
  if (slots === undefined) {
    if (classMemo.size >= CLASS_MEMO_MAX_ENTRIES) classMemo.clear();
    slots = new Array<ClassEfficiency | undefined>(48);
    classMemo.set(ratedPowerKw, slots);
  }
  const frozen = Object.freeze({ efficiencyPct: value.efficiencyPct, source: value.source });
  slots[memoSlot(poles, frequencyHz, ieClass)] = frozen;
  return frozen;
}
