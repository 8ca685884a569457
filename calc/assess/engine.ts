/**
 * The numeric core of the assessment, shared by `assess` (one motor, plain JSON result) and
 * `screenMotors` (many motors, typed-array columns): validation, operating points, the physics of
 * every option and its money, written as rounded numbers into figure columns. What the core may also
 * record (assumption entries, per-bin results) is built only when a caller asks for it, so a
 * screening pays for numbers only. There is one implementation of the physics and the money; the two
 * entry points differ only in what they build around it.
 *
 * It only composes the domain functions of calc/efficiency, calc/loads, calc/drives, calc/electrical
 * and calc/economics (their doc comments give the equations and sources).
 */
import type { PartLoadCurve } from '../contracts.js';
import { CalcInputError, requireInRange } from '../errors.js';
import { memoIecClassEfficiency, memoUnknownClassEfficiency, unknownClassEfficiency, POLES, type ClassEfficiency, type Poles } from '../efficiency/classes.js';
import {
  INDUCTION_CONSTANT_LOSS_SHARE,
  INDUCTION_MAGNETISING_REACTIVE_SHARE,
  PM_CONSTANT_LOSS_SHARE,
  REWIND_PENALTY_PCT_POINTS,
  inductionReactiveKvar,
  lossSplit,
  machineLossKw,
  rewoundEfficiency,
  typicalRatedPowerFactor,
  type LossSplit,
} from '../efficiency/part-load.js';
import { checkPartLoadCurve, readPartLoadCurve } from '../efficiency/part-load-curve.js';
import { driveFullLoadLossKw, driveInputPowerFactor, driveLossFromFullLoadKw, type DriveClass } from '../drives/losses.js';
import { DEFAULT_PUMP_STATIC_HEAD_FRACTION, flowOperatingPoint, speedControlApplies, type Application, type ControlMethod } from '../loads/fans-pumps.js';
import { powerFactorFromNameplate } from '../electrical/line-current.js';
import {
  capitalRecoveryFactor,
  checkSavingsCashFlows,
  discountedPaybackOfEscalatingSavings,
  escalatingSeriesFactor,
  internalRateOfReturnOfEscalatingSavings,
  netPresentValueOfEscalatingSavings,
  presentValueWithFactor,
  simplePaybackYears,
  type EscalatingSeriesFactor,
} from '../economics/cash-flows.js';
import { roundMoney } from '../economics/money.js';
import { annualDemandCost, effectiveEnergyPrice } from '../economics/tariff.js';
import { DEFAULT_PRICE_BOOK, PRICE_ITEMS, installationCost, itemCost, rebateAmount, type PriceBook } from '../economics/price-book.js';
import {
  CLASS_REGIME_START_YEAR,
  DEFAULT_DISCOUNT_RATE_PCT,
  DEFAULT_ENERGY_ESCALATION_PCT,
  DEFAULT_EXISTING_DRIVE_CLASS,
  DEFAULT_GRID_CO2_KG_PER_KWH,
  DEFAULT_HOURS_PER_YEAR,
  DEFAULT_LOAD_FACTOR,
  DEFAULT_NEW_DRIVE_CLASS,
  DEFAULT_OPTION_LIFE_YEARS,
  MAX_HOURS_PER_YEAR,
} from './defaults.js';
import { OPTIONS, type OptionDefinition, type OptionFamily } from './options.js';
import type { AssumptionsInput, MotorInput, PriceBookInput, SiteInput } from './schema.js';

/** One assumption behind a result: what, the value used, where it came from. */
export interface Assumption {
  what: string;
  value: number | string;
  source: string;
}

/** An option's operating point in one duty-profile bin. */
export interface BinResult {
  /** The bin's fraction as given: of rated load, or of design flow for a fan or pump [-]. */
  fraction: number;
  /** Hours of the bin [h/a]. */
  hours: number;
  /** Hours the motor runs in the bin [h/a] (less than hours only for on/off control). */
  runHours: number;
  /** Shaft power [kW]. */
  shaftKw: number;
  /** Shaft load / rated output [-]. */
  loadFraction: number;
  /** Speed / rated speed [-]. */
  speedFraction: number;
  /** Electrical input from the supply, drive included [kW]. */
  inputKw: number;
  /** Shaft power / input power [-] (0 when the shaft power is 0). */
  efficiency: number;
  /** Power factor at the supply [-] (0 when the motor does not run). */
  powerFactor: number;
  /** Line current [A]. */
  currentA: number;
  /** Apparent power [kVA]. */
  kva: number;
}

/**
 * The figures of one option, in the order of the figure columns. Units: ratedEfficiencyPct [%],
 * lifeYears [a], annualKwh [kWh/a], peakKw [kW], money [currency] or [currency/a], annualCo2Kg and
 * co2SavedKg [kg/a], paybacks [a], irr [-], lineCurrentA and lineCurrentReductionA [A], kva and
 * kvaReduction [kVA]. Each is rounded exactly as `assess` reports it; a figure `assess` reports as
 * null (no payback, no IRR, the baseline's paybacks and IRR) is NaN in a column.
 */
export const OPTION_FIGURES = [
  'ratedEfficiencyPct',
  'lifeYears',
  'annualKwh',
  'peakKw',
  'energyCost',
  'demandCost',
  'annualCost',
  'annualCo2Kg',
  'savingsKwh',
  'savingsCost',
  'co2SavedKg',
  'capex',
  'simplePaybackYears',
  'discountedPaybackYears',
  'npv',
  'irr',
  'lifeCycleCost',
  'equivalentAnnualCost',
  'lineCurrentA',
  'kva',
  'lineCurrentReductionA',
  'kvaReduction',
] as const;
export type OptionFigure = (typeof OPTION_FIGURES)[number];
/** One Float64Array per figure, one row per (motor, option slot). */
export type FigureColumns = Record<OptionFigure, Float64Array>;

/** Option slots per motor: every option of OPTIONS, in its order (slot 0 is the baseline 'keep'). */
export const OPTION_SLOTS = OPTIONS.length;

/**
 * Figure columns of `rows` rows (zeros; the core writes every row of a motor it assesses): views
 * into one buffer, one allocation instead of one per figure.
 */
export function figureColumns(rows: number): FigureColumns {
  const buffer = new ArrayBuffer(rows * OPTION_FIGURES.length * Float64Array.BYTES_PER_ELEMENT);
  let next = 0;
  const column = (): Float64Array => new Float64Array(buffer, rows * Float64Array.BYTES_PER_ELEMENT * next++, rows);
  // A literal, not properties added in a loop: the object keeps one fixed shape, so the hot loops
  // read its columns as fast properties.
  return {
    ratedEfficiencyPct: column(),
    lifeYears: column(),
    annualKwh: column(),
    peakKw: column(),
    energyCost: column(),
    demandCost: column(),
    annualCost: column(),
    annualCo2Kg: column(),
    savingsKwh: column(),
    savingsCost: column(),
    co2SavedKg: column(),
    capex: column(),
    simplePaybackYears: column(),
    discountedPaybackYears: column(),
    npv: column(),
    irr: column(),
    lifeCycleCost: column(),
    equivalentAnnualCost: column(),
    lineCurrentA: column(),
    kva: column(),
    lineCurrentReductionA: column(),
    kvaReduction: column(),
  };
}

/** What the core tells about a motor besides its option figures (a reused scratch object). */
export interface MotorSummary {
  poles: Poles;
  /** True when the poles were derived from speedRpm. */
  polesDerived: boolean;
  frequencyHz: 50 | 60;
  voltageV: number;
  application: Application;
  controlMethod: ControlMethod;
  /** Rated efficiency used for today's motor, rewinds included [%], rounded to 0.01. */
  efficiencyPct: number;
  /** Rated power factor [-], rounded to 0.001. */
  powerFactor: number;
  /** Σ hours of the duty profile [h/a]. */
  annualHours: number;
  /** True when the speed-control options (slots 6–11) apply. */
  speedControl: boolean;
  /** Slot of the recommended option: the highest rounded NPV above zero, else 0 ('keep'). */
  recommendedSlot: number;
}

/** A fresh summary object for the core to fill. */
export function motorSummary(): MotorSummary {
  return {
    poles: 4,
    polesDerived: false,
    frequencyHz: 50,
    voltageV: 0,
    application: 'other',
    controlMethod: 'direct-on-line',
    efficiencyPct: 0,
    powerFactor: 0,
    annualHours: 0,
    speedControl: false,
    recommendedSlot: 0,
  };
}

/** What `assess` asks the core to record beyond the numbers. */
export interface Recording {
  /** The assessment's assumptions, appended in order. */
  used: Assumption[];
  /** When true, the per-bin results of every option are built. */
  withBins: boolean;
  /** Per option slot: its per-bin results (empty when withBins is false). */
  bins: BinResult[][];
  /** Per option slot: the option's own assumptions. */
  optionAssumptions: Assumption[][];
}

/** Powers of ten by decimals, so rounding needs no Math.pow in the hot path. */
const SCALES = [1, 10, 100, 1000, 10000] as const;
export const round = (value: number, decimals: 0 | 1 | 2 | 3 | 4): number => Math.round(value * SCALES[decimals]) / SCALES[decimals];
// The same rounding with the scale as a literal (results are bit for bit those of `round`).
const round1 = (value: number): number => Math.round(value * 10) / 10;
export const round2 = (value: number): number => Math.round(value * 100) / 100;
const round3 = (value: number): number => Math.round(value * 1000) / 1000;
const round4 = (value: number): number => Math.round(value * 10000) / 10000;
/** A rounded figure, or NaN for a null one (the column's null). */
const round2OrNaN = (value: number | null): number => (value === null ? Number.NaN : round2(value));
const round4OrNaN = (value: number | null): number => (value === null ? Number.NaN : round4(value));

/** The BLDC model's source text by IE5 value; the memoised class values are shared objects, so a WeakMap finds them. */
const bldcSources = new WeakMap<ClassEfficiency, string>();

function bldcModelSource(ie5: ClassEfficiency): string {
  let source = bldcSources.get(ie5);
  if (source === undefined) {
    source = `no sized design given (motor.bldcCurve); IE5 ${ie5.efficiencyPct} % from ${ie5.source}`;
    bldcSources.set(ie5, source);
  }
  return source;
}

/** Error field of each price-book item, built once rather than per option. */
const ITEM_FIELDS: Readonly<Record<OptionFamily | 'vsd', string>> = {
  keep: 'priceBook.items.keep',
  rewind: 'priceBook.items.rewind',
  ie3: 'priceBook.items.ie3',
  ie4: 'priceBook.items.ie4',
  ie5: 'priceBook.items.ie5',
  bldc: 'priceBook.items.bldc',
  vsd: 'priceBook.items.vsd',
};

function mergePriceBook(priceBook: PriceBookInput | undefined): PriceBook {
  if (!priceBook) return DEFAULT_PRICE_BOOK;
  const items = { ...DEFAULT_PRICE_BOOK.items };
  for (const item of PRICE_ITEMS) {
    const bands = priceBook.items?.[item];
    if (bands) items[item] = bands;
  }
  return {
    currency: priceBook.currency,
    items,
    motorInstallation: priceBook.motorInstallation ?? DEFAULT_PRICE_BOOK.motorInstallation,
    driveInstallation: priceBook.driveInstallation ?? DEFAULT_PRICE_BOOK.driveInstallation,
    rebates: priceBook.rebates ?? DEFAULT_PRICE_BOOK.rebates,
  };
}

/** Gross capex of an option from the price book, less its rebate [currency]. */
function optionCapex(option: OptionDefinition, book: PriceBook, ratedPowerKw: number, hasDriveToday: boolean): number {
  let gross = 0;
  if (option.family === 'rewind') gross += itemCost(book.items.rewind, ratedPowerKw, 'priceBook.items.rewind');
  if (option.family === 'ie3' || option.family === 'ie4' || option.family === 'ie5' || option.family === 'bldc') {
    gross += itemCost(book.items[option.family], ratedPowerKw, ITEM_FIELDS[option.family]);
    gross += installationCost(book.motorInstallation, ratedPowerKw);
  }
  if (option.speedControl) {
    // A BLDC brings its drive; speed control then only needs the control loop wiring.
    if (option.family !== 'bldc' && !hasDriveToday) gross += itemCost(book.items.vsd, ratedPowerKw, 'priceBook.items.vsd');
    gross += installationCost(book.driveInstallation, ratedPowerKw);
  }
  return gross - rebateAmount(book.rebates?.[option.code], gross, ratedPowerKw);
}

/** Capital recovery and present-worth factors of one life at one rate and escalation. */
interface LifeFactors {
  capitalRecovery: number;
  series: EscalatingSeriesFactor;
}

/**
 * Factors by life [a] for the last (rate, escalation) seen: options share three or four lives and
 * most calls share the default rates, so the two powers are computed once, not twice per option.
 * Module scratch: a pure memo, the values are those of the functions it calls.
 */
const lifeMemo = { rate: Number.NaN, escalation: Number.NaN, byYears: [] as (LifeFactors | undefined)[] };

function lifeFactors(years: number, rate: number, escalation: number): LifeFactors {
  if (!Object.is(rate, lifeMemo.rate) || !Object.is(escalation, lifeMemo.escalation)) {
    lifeMemo.rate = rate;
    lifeMemo.escalation = escalation;
    lifeMemo.byYears = [];
  }
  let factors = lifeMemo.byYears[years];
  if (factors === undefined) {
    factors = { capitalRecovery: capitalRecoveryFactor(rate, years), series: escalatingSeriesFactor(years, rate, escalation) };
    lifeMemo.byYears[years] = factors;
  }
  return factors;
}

/** Assumption entries that do not depend on the input, built once. */
const DEFAULT_ENTRIES = Object.freeze({
  discount: Object.freeze({ what: 'discount rate [%/a]', value: DEFAULT_DISCOUNT_RATE_PCT, source: 'DEFAULT_DISCOUNT_RATE_PCT (common practice)' }),
  escalation: Object.freeze({ what: 'energy price escalation [%/a]', value: DEFAULT_ENERGY_ESCALATION_PCT, source: 'DEFAULT_ENERGY_ESCALATION_PCT (common practice)' }),
  lives: Object.freeze({ what: 'lives of the options [a]', value: JSON.stringify(DEFAULT_OPTION_LIFE_YEARS), source: 'DEFAULT_OPTION_LIFE_YEARS (common practice)' }),
  priceBook: Object.freeze({ what: 'price book', value: 'default', source: 'DEFAULT_PRICE_BOOK: placeholder prices in the site currency (common practice, no source)' }),
  newDrive: Object.freeze({ what: 'class of a new drive (IEC 61800-9-2)', value: DEFAULT_NEW_DRIVE_CLASS, source: 'DEFAULT_NEW_DRIVE_CLASS (common practice)' }),
  partLoad: Object.freeze({
    what: 'part-load model',
    value: `constant loss share ${INDUCTION_CONSTANT_LOSS_SHARE} (induction), ${PM_CONSTANT_LOSS_SHARE} (permanent magnet); reactive power Q = Q_FL·(${INDUCTION_MAGNETISING_REACTIVE_SHARE} + ${1 - INDUCTION_MAGNETISING_REACTIVE_SHARE}·t²)`,
    source: 'loss segregation of IEC 60034-2-1, typical shares (common practice); power factor fitted to handbook curve',
  }),
  flowCurves: Object.freeze({ what: 'part-flow power curves', value: 'throttle 0.45+0.55q, damper 0.5+0.5q, vanes 0.3+0.2q+0.5q², speed control q·(h+(1−h)q²)', source: 'fan and pump system handbooks (calc/loads/fans-pumps.ts; values from memory) and affinity laws' }),
  size: Object.freeze({ what: 'replacement size', value: 'same rated power', source: 'every new motor has the rated power of today’s (no right-sizing)' }),
});

/**
 * Everything that depends only on the site, the price book and the assumptions, worked out once for
 * a batch (or once per `assess` call).
 */
export interface AssessmentContext {
  site: SiteInput;
  assumptions: AssumptionsInput | undefined;
  /** A site-level input error; the core throws it where a one-motor assessment meets it. */
  error: CalcInputError | null;
  discountRate: number;
  escalation: number;
  lives: Record<OptionFamily | 'vsd', number>;
  rewindPenalty: number;
  newDriveClass: DriveClass;
  price: number;
  demandCharge: number;
  co2Factor: number;
  book: PriceBook;
  /** site.currency, else the price book's, else null. */
  currency: string | null;
  /** The site-level assumption entries (rates, lives, tariff, CO2, price book), in the report's order. */
  entries: Assumption[];
  /**
   * Capex by rated power [kW]: per option slot without (slots 0–11) and with a drive today (12–23),
   * NaN until computed. A register repeats few ratings, so each is priced once per batch.
   */
  capexByRating: Map<number, Float64Array> | null;
  /** Life of each option slot [a]: its family's, or the shorter of it and the drive's for a speed-control option. */
  lifeYearsBySlot: number[];
}

/** Ratings the capex memo of a batch holds before it starts again [-]. */
const CAPEX_MEMO_RATINGS = 4096;

/** The capex memo of one rating in a batch (NaN until priced), or null for a single assessment. */
function capexMemo(context: AssessmentContext, ratedPowerKw: number): Float64Array | null {
  if (context.capexByRating === null) return null;
  let byRating = context.capexByRating.get(ratedPowerKw);
  if (byRating === undefined) {
    if (context.capexByRating.size >= CAPEX_MEMO_RATINGS) context.capexByRating.clear(); // a bound on memory, not a model
    byRating = new Float64Array(2 * OPTION_SLOTS).fill(Number.NaN);
    context.capexByRating.set(ratedPowerKw, byRating);
  }
  return byRating;
}

/** Capex of an option for a motor, priced once per rating, drive today and slot in a batch [currency]. */
function memoCapex(context: AssessmentContext, byRating: Float64Array | null, slot: number, option: OptionDefinition, ratedPowerKw: number, hasDriveToday: boolean): number {
  if (byRating === null) return optionCapex(option, context.book, ratedPowerKw, hasDriveToday);
  const index = hasDriveToday ? OPTION_SLOTS + slot : slot;
  let capex = byRating[index]!;
  if (Number.isNaN(capex)) {
    capex = optionCapex(option, context.book, ratedPowerKw, hasDriveToday); // throws, each time, on a bad price book
    byRating[index] = capex;
  }
  return capex;
}

/**
 * Works out what an assessment shares across motors.
 *
 * @param site the site (SiteInput); @param priceBook optional, missing parts from DEFAULT_PRICE_BOOK
 * @param assumptions optional overrides of calc/assess/defaults.ts
 * @param record when true, the site-level assumption entries are built too
 * @param batch when true, capex is memoised by rating (worth it over many motors, not for one)
 * @returns the context; an invalid tariff or price-book currency is kept in `error`, not thrown.
 */
export function assessmentContext(site: SiteInput, priceBook: PriceBookInput | undefined, assumptions: AssumptionsInput | undefined, record: boolean, batch: boolean): AssessmentContext {
  const discountRate = (assumptions?.discountRatePct ?? DEFAULT_DISCOUNT_RATE_PCT) / 100;
  const escalation = (assumptions?.energyEscalationPct ?? DEFAULT_ENERGY_ESCALATION_PCT) / 100;
  // Read only, so the defaults need no copy when no life is given.
  const lives = (assumptions?.lifeYears === undefined ? DEFAULT_OPTION_LIFE_YEARS : { ...DEFAULT_OPTION_LIFE_YEARS, ...assumptions.lifeYears }) as Record<OptionFamily | 'vsd', number>;
  const entries: Assumption[] = [];
  if (record) {
    entries.push(
      assumptions?.discountRatePct === undefined ? DEFAULT_ENTRIES.discount : { what: 'discount rate [%/a]', value: assumptions.discountRatePct, source: 'given' },
      assumptions?.energyEscalationPct === undefined ? DEFAULT_ENTRIES.escalation : { what: 'energy price escalation [%/a]', value: assumptions.energyEscalationPct, source: 'given' },
      assumptions?.lifeYears === undefined ? DEFAULT_ENTRIES.lives : { what: 'lives of the options [a]', value: JSON.stringify(lives), source: 'given, others DEFAULT_OPTION_LIFE_YEARS' },
    );
  }
  let error: CalcInputError | null = null;
  let price = Number.NaN;
  try {
    price = effectiveEnergyPrice(site.energyPricePerKwh, site.timeOfUse);
  } catch (thrown) {
    if (!(thrown instanceof CalcInputError)) throw thrown;
    error = thrown;
  }
  const demandCharge = site.demandChargePerKwMonth ?? 0;
  const co2Factor = site.co2KgPerKwh ?? assumptions?.co2KgPerKwh ?? DEFAULT_GRID_CO2_KG_PER_KWH;
  if (record) {
    entries.push(
      { what: 'energy price [currency/kWh]', value: price, source: site.timeOfUse ? 'time-of-use table, running hours spread by hoursShare' : "site's flat price" },
      { what: 'demand charge [currency/(kW·month)]', value: demandCharge, source: site.demandChargePerKwMonth === undefined ? 'none given' : "site's demand charge, motor peak coincident with the site's" },
      {
        what: 'grid CO2 factor [kg/kWh]',
        value: co2Factor,
        source: site.co2KgPerKwh !== undefined ? "site's factor" : assumptions?.co2KgPerKwh !== undefined ? 'given in assumptions' : 'DEFAULT_GRID_CO2_KG_PER_KWH (value from memory)',
      },
    );
  }
  const book = mergePriceBook(priceBook);
  if (error === null && book.currency !== undefined && site.currency !== undefined && book.currency !== site.currency) {
    error = new CalcInputError('priceBook.currency', `must equal site.currency (${site.currency})`);
  }
  if (record) entries.push(priceBook ? { what: 'price book', value: 'given', source: 'given; missing items from DEFAULT_PRICE_BOOK' } : DEFAULT_ENTRIES.priceBook);
  return {
    site,
    assumptions,
    error,
    discountRate,
    escalation,
    lives,
    rewindPenalty: assumptions?.rewindPenaltyPctPoints ?? REWIND_PENALTY_PCT_POINTS,
    newDriveClass: assumptions?.newDriveClass ?? DEFAULT_NEW_DRIVE_CLASS,
    price,
    demandCharge,
    co2Factor,
    book,
    currency: site.currency ?? book.currency ?? null,
    entries,
    capexByRating: batch ? new Map() : null,
    lifeYearsBySlot: OPTIONS.map((option) => (option.speedControl ? Math.min(lives[option.family], lives.vsd) : lives[option.family])),
  };
}

/**
 * Operating points of the bins under one flow-control method, in reused columns (module scratch:
 * filled and read within one motor's assessment).
 */
class PointColumns {
  count = 0;
  fraction = new Float64Array(16);
  hours = new Float64Array(16);
  runHours = new Float64Array(16);
  shaftKw = new Float64Array(16);
  speedFraction = new Float64Array(16);
  torqueFraction = new Float64Array(16);
  /**
   * The per-bin figures that do not depend on the option, rounded once per point when per-bin
   * results are built; every option's BinResult copies them (plain numbers, shared, not re-boxed).
   */
  shared: SharedBinFigures[] = [];

  reset(count: number): void {
    this.count = count;
    if (count <= this.fraction.length) return;
    const size = Math.max(count, 2 * this.fraction.length);
    this.fraction = new Float64Array(size);
    this.hours = new Float64Array(size);
    this.runHours = new Float64Array(size);
    this.shaftKw = new Float64Array(size);
    this.speedFraction = new Float64Array(size);
    this.torqueFraction = new Float64Array(size);
  }

  /**
   * Fills `shared` (only when per-bin results are built).
   * @param profile the duty profile, whose fraction and hours the bins repeat as given (null: one bin)
   */
  round(profile: readonly { fraction: number; hours: number }[] | null, singleFraction: number, singleHours: number, ratedPowerKw: number): void {
    const shared = new Array<SharedBinFigures>(this.count);
    for (let index = 0; index < this.count; index += 1) {
      const shaftKw = this.shaftKw[index]!;
      shared[index] = {
        fraction: profile === null ? singleFraction : profile[index]!.fraction,
        hours: profile === null ? singleHours : profile[index]!.hours,
        runHours: round2(this.runHours[index]!),
        shaftKw: round4(shaftKw),
        loadFraction: round4(shaftKw / ratedPowerKw),
        speedFraction: round4(this.speedFraction[index]!),
      };
    }
    this.shared = shared;
  }
}

/** The figures of a BinResult that every option shares. */
type SharedBinFigures = Pick<BinResult, 'fraction' | 'hours' | 'runHours' | 'shaftKw' | 'loadFraction' | 'speedFraction'>;

const todayPoints = new PointColumns();
const speedPoints = new PointColumns();

/** One bin's operating point under a control method, written at `index` of `points`. */
function fillPoint(
  points: PointColumns,
  index: number,
  fraction: number,
  hours: number,
  method: ControlMethod,
  isFlowLoad: boolean,
  designLoad: number,
  staticHead: number,
  ratedPowerKw: number,
): void {
  points.fraction[index] = fraction;
  points.hours[index] = hours;
  if (!isFlowLoad) {
    points.runHours[index] = hours;
    points.shaftKw[index] = fraction * ratedPowerKw;
    points.speedFraction[index] = 1;
    points.torqueFraction[index] = fraction;
    return;
  }
  const point = flowOperatingPoint(method, fraction, staticHead);
  const load = designLoad * point.powerFraction;
  if (load > 1.25) throw new CalcInputError(`motor.dutyProfile.${index}.fraction`, 'gives a shaft load above 125 % of rated');
  points.runHours[index] = hours * point.runFraction;
  points.shaftKw[index] = load * ratedPowerKw;
  points.speedFraction[index] = point.speedFraction;
  points.torqueFraction[index] = point.speedFraction > 0 ? load / point.speedFraction : 0;
}

/** How one option turns shaft power into input power (a reused scratch object). */
interface OptionModel {
  ratedEfficiency: number;
  split: LossSplit | null;
  curve: PartLoadCurve | null;
  /** Induction motor's full-load reactive power on the line [kvar]; 0 for a drive-fed option. */
  fullLoadReactiveKvar: number;
  /** Induction motor's no-load current / rated current [-]. */
  noLoadCurrentShare: number;
  isPermanentMagnet: boolean;
  driveClass: DriveClass | null;
  /** Full-load losses of the option's drive [kW]; 0 without a drive. */
  driveFullLoadLossKw: number;
}

const model: OptionModel = {
  ratedEfficiency: 0,
  split: null,
  curve: null,
  fullLoadReactiveKvar: 0,
  noLoadCurrentShare: 0,
  isPermanentMagnet: false,
  driveClass: null,
  driveFullLoadLossKw: 0,
};

/** `model` for the BLDC option: a given curve (motor and drive together), else the PM loss split and its drive. */
function setBldcModel(ratedEfficiency: number, split: LossSplit | null, curve: PartLoadCurve | null, driveClass: DriveClass | null, driveLossKw: number): void {
  model.ratedEfficiency = ratedEfficiency;
  model.split = split;
  model.curve = curve;
  model.fullLoadReactiveKvar = 0;
  model.noLoadCurrentShare = 0;
  model.isPermanentMagnet = true;
  model.driveClass = driveClass;
  model.driveFullLoadLossKw = driveLossKw;
}

/**
 * `model` for an induction option of rated efficiency η [-] at today's rated power factor: full-load
 * reactive power Q_FL = (P/η)·tan φ [kvar], no-load current share m·sin φ [-], and its drive, if any.
 */
function setInductionModel(efficiency: number, split: LossSplit, driveClass: DriveClass | null, ratedPowerKw: number, ratedPowerFactor: number, sinPhi: number): void {
  model.ratedEfficiency = efficiency;
  model.split = split;
  model.curve = null;
  model.fullLoadReactiveKvar = (ratedPowerKw / efficiency) * (sinPhi / ratedPowerFactor);
  model.noLoadCurrentShare = INDUCTION_MAGNETISING_REACTIVE_SHARE * sinPhi;
  model.isPermanentMagnet = false;
  model.driveClass = driveClass;
  model.driveFullLoadLossKw = driveClass ? driveFullLoadLossKw(ratedPowerKw, driveClass) : 0;
}

/** Raw (unrounded) physics totals of the options of one motor, by slot (module scratch). */
const physics = {
  annualKwh: new Float64Array(OPTION_SLOTS),
  peakKw: new Float64Array(OPTION_SLOTS),
  peakCurrent: new Float64Array(OPTION_SLOTS),
  peakKva: new Float64Array(OPTION_SLOTS),
  ratedEfficiency: new Float64Array(OPTION_SLOTS),
};

const SQRT3 = Math.sqrt(3);

/**
 * Input power, power factor and current of one option at every bin, totals into `physics` at `slot`:
 * P_in = P_shaft + P_loss,motor(s, t) [+ P_loss,drive(c)], I = P_in/(√3·V·PF).
 */
function evaluateOption(slot: number, points: PointColumns, ratedPowerKw: number, voltageV: number, bins: BinResult[] | null): void {
  let annualKwh = 0;
  let peakKw = 0;
  let peakCurrent = 0;
  let peakKva = 0;
  // The model's fields as locals: the loop calls domain functions, after which the engine would
  // otherwise reload them from the shared scratch object.
  const curve = model.curve;
  const split = model.split;
  const driveClass = model.driveClass;
  const noLoadCurrentShare = model.noLoadCurrentShare;
  const isPermanentMagnet = model.isPermanentMagnet;
  const driveLossKw = model.driveFullLoadLossKw;
  const ratedEfficiency = model.ratedEfficiency;
  const fullLoadReactiveKvar = model.fullLoadReactiveKvar;
  for (let index = 0; index < points.count; index += 1) {
    const runHours = points.runHours[index]!;
    const shaftKw = points.shaftKw[index]!;
    const speedFraction = points.speedFraction[index]!;
    const torqueFraction = points.torqueFraction[index]!;
    let inputKw = 0;
    let powerFactor = 0;
    const running = runHours > 0 && speedFraction > 0;
    if (running) {
      if (curve) {
        const reading = readPartLoadCurve(curve, shaftKw / curve.ratedPowerKw);
        inputKw = shaftKw / reading.efficiency;
        powerFactor = reading.powerFactor;
      } else {
        const motorInputKw = shaftKw + machineLossKw(split!, speedFraction, torqueFraction);
        if (driveClass) {
          const t = torqueFraction;
          const m = noLoadCurrentShare;
          // Motor current / rated: ∝ torque for a PM motor; magnetising part in quadrature for an induction motor.
          const currentFraction = isPermanentMagnet ? t : Math.sqrt(m * m + (1 - m * m) * t * t);
          inputKw = motorInputKw + driveLossFromFullLoadKw(driveLossKw, currentFraction);
          powerFactor = driveInputPowerFactor(Math.min((motorInputKw * ratedEfficiency) / ratedPowerKw, 1.5));
        } else {
          inputKw = motorInputKw;
          const reactive = inductionReactiveKvar(fullLoadReactiveKvar, 1, torqueFraction);
          powerFactor = inputKw / Math.sqrt(inputKw * inputKw + reactive * reactive);
        }
      }
    }
    const kva = powerFactor > 0 ? inputKw / powerFactor : 0;
    const currentA = (1000 * kva) / (SQRT3 * voltageV); // I = P/(√3·V·PF)
    if (running) {
      annualKwh += inputKw * runHours;
      if (inputKw > peakKw) peakKw = inputKw;
      if (currentA > peakCurrent) {
        peakCurrent = currentA;
        peakKva = kva;
      }
    }
    if (bins === null) continue;
    const shared = points.shared[index]!;
    bins[index] = {
      fraction: shared.fraction,
      hours: shared.hours,
      runHours: shared.runHours,
      shaftKw: shared.shaftKw,
      loadFraction: shared.loadFraction,
      speedFraction: shared.speedFraction,
      inputKw: round4(inputKw),
      efficiency: inputKw > 0 ? round4(shaftKw / inputKw) : 0,
      powerFactor: round3(powerFactor),
      currentA: round2(currentA),
      kva: round3(kva),
    };
  }
  physics.annualKwh[slot] = annualKwh;
  physics.peakKw[slot] = peakKw;
  physics.peakCurrent[slot] = peakCurrent;
  physics.peakKva[slot] = peakKva;
  physics.ratedEfficiency[slot] = ratedEfficiency;
}

/** Poles from the motor, or derived from its speed; `summary.polesDerived` says which. */
function resolvePoles(motor: MotorInput, frequencyHz: number, summary: MotorSummary): Poles {
  if (motor.poles !== undefined) {
    if (!POLES.includes(motor.poles)) throw new CalcInputError('motor.poles', 'must be 2, 4, 6 or 8');
    summary.polesDerived = false;
    return motor.poles;
  }
  if (motor.speedRpm === undefined) throw new CalcInputError('motor.poles', 'or speedRpm is required');
  for (const poles of POLES) {
    const synchronous = (120 * frequencyHz) / poles;
    if (motor.speedRpm < synchronous && motor.speedRpm > 0.8 * synchronous) {
      summary.polesDerived = true;
      return poles;
    }
  }
  throw new CalcInputError('motor.speedRpm', `matches no 2-, 4-, 6- or 8-pole induction motor at ${frequencyHz} Hz`);
}

/** Loss splits of the induction options of one motor by slot (module scratch). */
const familySplits: (LossSplit | null)[] = new Array<LossSplit | null>(OPTION_SLOTS).fill(null);

/** Rated efficiency [-] of each induction option family for the motor being assessed (module scratch). */
const inductionEfficiency = { keep: 0, rewind: 0, ie3: 0, ie4: 0, ie5: 0 };

/**
 * Assesses one motor against every option and writes each option's rounded figures into `columns`
 * at rows `firstRow + slot` (slot = index in OPTIONS; the slots of options that do not apply are set
 * to NaN). Same checks, same arithmetic and same order of operations for every caller.
 *
 * @param motor the motor (MotorInput, parsed); @param context from `assessmentContext`
 * @param columns figure columns; @param firstRow row of slot 0
 * @param summary filled with the motor's own figures and the recommended slot
 * @param recording null for numbers only; else the assumptions and per-bin results are recorded
 * @throws CalcInputError naming the field ("motor.…", or the site's) for input that breaks a rule.
 */
export function assessMotorInto(motor: MotorInput, context: AssessmentContext, columns: FigureColumns, firstRow: number, summary: MotorSummary, recording: Recording | null): void {
  const { site, assumptions } = context;
  const used = recording === null ? null : recording.used;
  const ratedPowerKw = motor.ratedPowerKw;
  requireInRange('motor.ratedPowerKw', ratedPowerKw, 0.12, 1000);

  // Supply.
  const frequencyHz = motor.frequencyHz ?? site.frequencyHz;
  if (frequencyHz === undefined) throw new CalcInputError('motor.frequencyHz', 'is required unless site.frequencyHz is given');
  if (frequencyHz !== 50 && frequencyHz !== 60) throw new CalcInputError('motor.frequencyHz', 'must be 50 or 60');
  const voltageV = motor.voltageV ?? site.voltageV;
  if (voltageV === undefined) throw new CalcInputError('motor.voltageV', 'is required unless site.voltageV is given');
  if (!(voltageV > 0)) throw new CalcInputError(motor.voltageV === undefined ? 'site.voltageV' : 'motor.voltageV', 'must be positive');
  if (used !== null && motor.voltageV === undefined) used.push({ what: 'supply voltage', value: voltageV, source: "site's voltage [V]" });
  if (used !== null && motor.frequencyHz === undefined) used.push({ what: 'supply frequency', value: frequencyHz, source: "site's frequency [Hz]" });
  const poles = resolvePoles(motor, frequencyHz, summary);
  if (used !== null && summary.polesDerived) used.push({ what: 'poles', value: poles, source: `from speedRpm ${motor.speedRpm} below the synchronous speed ${(120 * frequencyHz) / poles} rpm` });

  // Rates, lives, tariff, price book: the site's (worked out once per batch).
  if (used !== null) for (const entry of context.entries) used.push(entry);
  if (context.error !== null) throw context.error;
  const { rewindPenalty, newDriveClass, price, demandCharge } = context;

  // Today's motor: rated efficiency.
  const rewinds = motor.rewinds ?? 0;
  if (!Number.isInteger(rewinds) || rewinds < 0 || rewinds > 10) throw new CalcInputError('motor.rewinds', 'must be a whole number from 0 to 10');
  const original = originalEfficiency(motor, assumptions, poles, frequencyHz, used !== null);
  const baseEfficiency = rewoundEfficiency(original.efficiencyPct / 100, rewinds, rewindPenalty);
  if (used !== null) {
    used.push({ what: "today's rated efficiency before rewinds [%]", value: original.efficiencyPct, source: original.source });
    if (rewinds > 0) {
      used.push({ what: 'efficiency lost per rewind [percentage points]', value: rewindPenalty, source: assumptions?.rewindPenaltyPctPoints === undefined ? 'REWIND_PENALTY_PCT_POINTS (common practice)' : 'given' });
    }
  }

  // Power factor of the induction motors at rated load.
  const ratedPowerFactor = ratedInductionPowerFactor(motor, original, poles, used);
  if (used !== null) used.push({ what: 'rated power factor of new induction motors', value: round(ratedPowerFactor, 3), source: "same as today's motor (assumption)" });

  // Load: duty profile or one bin.
  const application: Application = motor.application ?? 'other';
  const controlMethod: ControlMethod = motor.controlMethod ?? 'direct-on-line';
  const isFlowLoad = application === 'fan' || application === 'pump';
  const hasDriveToday = controlMethod === 'variable-speed-drive';
  const profile = motor.dutyProfile !== undefined && motor.dutyProfile.length > 0 ? motor.dutyProfile : null;
  let annualHours: number;
  let singleFraction = 0;
  let singleHours = 0;
  if (profile !== null) {
    let total = 0;
    for (let index = 0; index < profile.length; index += 1) {
      const bin = profile[index]!;
      // The same checks as requireInRange, with the field name built only when one fails.
      if (!(bin.fraction >= 0 && bin.fraction <= 1.25)) requireInRange(`motor.dutyProfile.${index}.fraction`, bin.fraction, 0, 1.25);
      if (!(bin.hours >= 0 && bin.hours <= MAX_HOURS_PER_YEAR)) requireInRange(`motor.dutyProfile.${index}.hours`, bin.hours, 0, MAX_HOURS_PER_YEAR);
      total += bin.hours;
    }
    if (total > MAX_HOURS_PER_YEAR) throw new CalcInputError('motor.dutyProfile', `hours must add up to ${MAX_HOURS_PER_YEAR} or less`);
    annualHours = total;
    if (used !== null) used.push({ what: 'duty profile', value: `${profile.length} bins, ${total} h/a`, source: isFlowLoad ? 'given; fractions of design flow' : 'given; fractions of rated load' });
  } else {
    const hours = motor.hoursPerYear ?? site.defaultHoursPerYear ?? assumptions?.defaultHoursPerYear ?? DEFAULT_HOURS_PER_YEAR;
    requireInRange(motor.hoursPerYear !== undefined ? 'motor.hoursPerYear' : 'site.defaultHoursPerYear', hours, 0, MAX_HOURS_PER_YEAR);
    if (used !== null) {
      const hoursSource =
        motor.hoursPerYear !== undefined ? 'given' : site.defaultHoursPerYear !== undefined ? "site's default hours" : assumptions?.defaultHoursPerYear !== undefined ? 'given in assumptions' : 'DEFAULT_HOURS_PER_YEAR (two shifts, common practice)';
      used.push({ what: 'running hours [h/a]', value: hours, source: hoursSource });
    }
    const loadFactor = motor.loadFactor ?? assumptions?.defaultLoadFactor ?? DEFAULT_LOAD_FACTOR;
    singleFraction = isFlowLoad ? 1 : loadFactor;
    singleHours = hours;
    annualHours = 0 + hours; // Σ hours from 0, as for a profile (turns −0 into 0)
  }
  const designLoad = isFlowLoad ? (motor.loadFactor ?? assumptions?.defaultLoadFactor ?? DEFAULT_LOAD_FACTOR) : 1;
  requireInRange('motor.loadFactor', designLoad, 0, 1.25);
  if (used !== null && (isFlowLoad || motor.dutyProfile === undefined)) {
    used.push({
      what: isFlowLoad ? 'motor load at design flow [-]' : 'load factor [-]',
      value: isFlowLoad ? designLoad : singleFraction,
      source: motor.loadFactor !== undefined ? 'given' : assumptions?.defaultLoadFactor !== undefined ? 'given in assumptions' : 'DEFAULT_LOAD_FACTOR (US DOE motor-load fact sheet: typically 0.6–0.8)',
    });
  }
  const staticHead = application === 'pump' ? (motor.staticHeadFraction ?? DEFAULT_PUMP_STATIC_HEAD_FRACTION) : (motor.staticHeadFraction ?? 0);
  if (used !== null && isFlowLoad) {
    used.push({ what: 'flow control today', value: controlMethod, source: 'given or direct-on-line (on/off) by default' }, DEFAULT_ENTRIES.flowCurves);
    if (application === 'pump') used.push({ what: 'static head / design head [-]', value: staticHead, source: motor.staticHeadFraction !== undefined ? 'given' : 'DEFAULT_PUMP_STATIC_HEAD_FRACTION (common practice)' });
  }

  const speedControl = speedControlApplies(application, controlMethod);
  const binCount = profile === null ? 1 : profile.length;
  todayPoints.reset(binCount);
  for (let index = 0; index < binCount; index += 1) {
    const fraction = profile === null ? singleFraction : profile[index]!.fraction;
    const hours = profile === null ? singleHours : profile[index]!.hours;
    fillPoint(todayPoints, index, fraction, hours, controlMethod, isFlowLoad, designLoad, staticHead, ratedPowerKw);
  }
  if (speedControl) {
    speedPoints.reset(binCount);
    for (let index = 0; index < binCount; index += 1) {
      const fraction = profile === null ? singleFraction : profile[index]!.fraction;
      const hours = profile === null ? singleHours : profile[index]!.hours;
      fillPoint(speedPoints, index, fraction, hours, 'variable-speed-drive', isFlowLoad, designLoad, staticHead, ratedPowerKw);
    }
  }

  if (recording !== null && recording.withBins) {
    todayPoints.round(profile, singleFraction, singleHours, ratedPowerKw);
    if (speedControl) speedPoints.round(profile, singleFraction, singleHours, ratedPowerKw);
  }

  // Option models.
  const existingDriveClass: DriveClass = motor.driveClass ?? DEFAULT_EXISTING_DRIVE_CLASS;
  if (used !== null) {
    if (hasDriveToday) used.push({ what: 'class of the drive fitted today (IEC 61800-9-2)', value: existingDriveClass, source: motor.driveClass ? 'given' : 'DEFAULT_EXISTING_DRIVE_CLASS (common practice)' });
    used.push(
      assumptions?.newDriveClass ? { what: 'class of a new drive (IEC 61800-9-2)', value: newDriveClass, source: 'given' } : DEFAULT_ENTRIES.newDrive,
      DEFAULT_ENTRIES.partLoad,
      DEFAULT_ENTRIES.size,
    );
  }

  const sinPhi = Math.sqrt(1 - ratedPowerFactor * ratedPowerFactor);
  // Rated efficiency of each induction option, computed once.
  const ie3 = memoIecClassEfficiency(ratedPowerKw, poles, frequencyHz, 'IE3');
  const ie4 = memoIecClassEfficiency(ratedPowerKw, poles, frequencyHz, 'IE4');
  const ie5 = memoIecClassEfficiency(ratedPowerKw, poles, frequencyHz, 'IE5');
  inductionEfficiency.keep = baseEfficiency;
  inductionEfficiency.rewind = rewoundEfficiency(baseEfficiency, 1, rewindPenalty);
  inductionEfficiency.ie3 = ie3.efficiencyPct / 100;
  inductionEfficiency.ie4 = ie4.efficiencyPct / 100;
  inductionEfficiency.ie5 = ie5.efficiencyPct / 100;
  const bldcCurve = motor.bldcCurve ?? null;
  let bldcRatedEfficiency: number;
  let bldcSplit: LossSplit | null = null;
  let bldcDriveLossKw = 0;
  let bldcAssumptions: Assumption[] | null = null;
  if (bldcCurve) {
    checkPartLoadCurve(bldcCurve, 'motor.bldcCurve');
    bldcRatedEfficiency = readPartLoadCurve(bldcCurve, 1).efficiency;
    if (used !== null) bldcAssumptions = [{ what: 'BLDC model', value: 'part-load curve', source: `given curve: ${bldcCurve.source} (motor and drive together, read at the shaft-load fraction)` }];
  } else {
    bldcRatedEfficiency = ie5.efficiencyPct / 100;
    bldcSplit = lossSplit(ratedPowerKw, ie5.efficiencyPct / 100, PM_CONSTANT_LOSS_SHARE);
    bldcDriveLossKw = driveFullLoadLossKw(ratedPowerKw, newDriveClass);
    if (used !== null) {
      bldcAssumptions = [
        { what: 'BLDC model', value: 'generic permanent-magnet part-load model at the IE5 level', source: bldcModelSource(ie5) },
        { what: 'BLDC drive class (IEC 61800-9-2)', value: newDriveClass, source: 'new drive' },
      ];
    }
  }
  const todayDrive = hasDriveToday ? existingDriveClass : null;

  // Physics of every option (all of them before any money, so errors come in the same order).
  for (let slot = 0; slot < OPTION_SLOTS; slot += 1) {
    const option = OPTIONS[slot]!;
    if (option.speedControl && !speedControl) continue;
    if (option.family === 'bldc') {
      setBldcModel(bldcRatedEfficiency, bldcSplit, bldcCurve, bldcCurve ? null : newDriveClass, bldcDriveLossKw);
    } else {
      const efficiency = inductionEfficiency[option.family];
      // A family's split serves its speed-control variant too (slot − 6): same rating, same efficiency.
      const split = option.speedControl ? familySplits[slot - OPTION_SLOTS / 2]! : lossSplit(ratedPowerKw, efficiency, INDUCTION_CONSTANT_LOSS_SHARE);
      familySplits[slot] = split;
      setInductionModel(efficiency, split, option.speedControl ? newDriveClass : todayDrive, ratedPowerKw, ratedPowerFactor, sinPhi);
    }
    let bins: BinResult[] | null = null;
    if (recording !== null) {
      bins = recording.withBins ? new Array<BinResult>(binCount) : [];
      recording.bins[slot] = bins;
      if (option.family === 'bldc') {
        recording.optionAssumptions[slot] = bldcAssumptions!;
      } else {
        const source = inductionSource(option.family, original, rewinds, rewindPenalty, ie3, ie4, ie5);
        const own: Assumption[] = [{ what: 'rated efficiency [%]', value: round(model.ratedEfficiency * 100, 2), source }];
        if (model.driveClass) own.push({ what: 'drive class (IEC 61800-9-2)', value: model.driveClass, source: option.speedControl ? 'new drive' : 'drive fitted today' });
        recording.optionAssumptions[slot] = own;
      }
    }
    evaluateOption(slot, option.speedControl ? speedPoints : todayPoints, ratedPowerKw, voltageV, recording !== null && recording.withBins ? bins : null);
  }

  // Money of every option, rounded once into the columns.
  const baselineKwh = physics.annualKwh[0]!;
  baseline.kwh = baselineKwh;
  baseline.cost = baselineKwh * price + annualDemandCost(physics.peakKw[0]!, demandCharge);
  baseline.current = physics.peakCurrent[0]!;
  baseline.kva = physics.peakKva[0]!;
  const capexRow = capexMemo(context, ratedPowerKw);
  let recommendedSlot = 0;
  let bestNpv = 0;
  for (let slot = 0; slot < OPTION_SLOTS; slot += 1) {
    const row = firstRow + slot;
    if (OPTIONS[slot]!.speedControl && !speedControl) {
      clearRow(columns, row);
      continue;
    }
    const npv = optionMoney(context, capexRow, slot, columns, row, ratedPowerKw, hasDriveToday);
    // Recommendation: the highest NPV above zero (the first of equal ones).
    if (slot > 0 && npv > 0 && (recommendedSlot === 0 || npv > bestNpv)) {
      recommendedSlot = slot;
      bestNpv = npv;
    }
  }

  summary.poles = poles;
  summary.frequencyHz = frequencyHz;
  summary.voltageV = voltageV;
  summary.application = application;
  summary.controlMethod = controlMethod;
  summary.efficiencyPct = round(baseEfficiency * 100, 2);
  summary.powerFactor = round(ratedPowerFactor, 3);
  summary.annualHours = annualHours;
  summary.speedControl = speedControl;
  summary.recommendedSlot = recommendedSlot;
}

/**
 * Today's motor's rated efficiency before rewinds: the nameplate's, else its class's; an unknown class
 * is IE2 for a motor installed under the class regime, else the below-IE1 default.
 * @param record when false the IE2 source text is left empty (it is only read when recording)
 * @returns the efficiency [%] and its source.
 */
function originalEfficiency(motor: MotorInput, assumptions: AssumptionsInput | undefined, poles: Poles, frequencyHz: 50 | 60, record: boolean): ClassEfficiency {
  const ratedPowerKw = motor.ratedPowerKw;
  const efficiencyClass = motor.efficiencyClass ?? 'unknown';
  if (motor.nameplateEfficiencyPct !== undefined) {
    requireInRange('motor.nameplateEfficiencyPct', motor.nameplateEfficiencyPct, 1, 99.9);
    return { efficiencyPct: motor.nameplateEfficiencyPct, source: 'nameplate efficiency (wins over the class value)' };
  }
  if (efficiencyClass === 'unknown') {
    if (motor.yearInstalled !== undefined && motor.yearInstalled >= CLASS_REGIME_START_YEAR) {
      const ie2 = memoIecClassEfficiency(ratedPowerKw, poles, frequencyHz, 'IE2');
      return { efficiencyPct: ie2.efficiencyPct, source: record ? `unknown class, installed ${motor.yearInstalled} ≥ ${CLASS_REGIME_START_YEAR}: IE2 minimum assumed; ${ie2.source}` : '' };
    }
    const lossFactor = assumptions?.unknownClassLossFactor;
    return lossFactor === undefined ? memoUnknownClassEfficiency(ratedPowerKw, poles, frequencyHz) : unknownClassEfficiency(ratedPowerKw, poles, frequencyHz, lossFactor);
  }
  if (efficiencyClass === 'IE1' || efficiencyClass === 'IE2' || efficiencyClass === 'IE3' || efficiencyClass === 'IE4' || efficiencyClass === 'IE5') {
    return memoIecClassEfficiency(ratedPowerKw, poles, frequencyHz, efficiencyClass);
  }
  throw new CalcInputError('motor.efficiencyClass', 'must be one of IE1, IE2, IE3, IE4, IE5, unknown');
}

/**
 * Rated power factor of today's induction motor, which the new induction motors keep: the
 * nameplate's, else from nameplate power, efficiency, voltage and current, else the typical value.
 * @param original today's rated efficiency before rewinds; @param used the assumption list, or null
 * @returns the power factor [-].
 */
function ratedInductionPowerFactor(motor: MotorInput, original: ClassEfficiency, poles: Poles, used: Assumption[] | null): number {
  if (motor.powerFactor !== undefined) {
    requireInRange('motor.powerFactor', motor.powerFactor, 0.05, 1);
    if (used !== null) used.push({ what: 'rated power factor', value: motor.powerFactor, source: 'nameplate' });
    return motor.powerFactor;
  }
  if (motor.ratedCurrentA !== undefined && motor.voltageV !== undefined) {
    const powerFactor = powerFactorFromNameplate(motor.ratedPowerKw, original.efficiencyPct / 100, motor.voltageV, motor.ratedCurrentA);
    if (used !== null) used.push({ what: 'rated power factor', value: round(powerFactor, 3), source: 'from nameplate power, efficiency, voltage and current: P/η/(√3·V·I)' });
    return powerFactor;
  }
  const powerFactor = typicalRatedPowerFactor(motor.ratedPowerKw, poles);
  if (used !== null) used.push({ what: 'rated power factor', value: powerFactor, source: 'typical value for the rating and poles (common practice, values from memory)' });
  return powerFactor;
}

/** The baseline's raw figures the options' savings are measured from (module scratch, one motor at a time). */
const baseline = { kwh: 0, cost: 0, current: 0, kva: 0 };

/**
 * Energy, cost, CO2, capex and the investment figures of the option in `slot`, from its physics
 * totals, rounded once into the columns at `row`.
 * @returns the rounded NPV [currency] (for the recommendation).
 */
function optionMoney(
  context: AssessmentContext,
  capexRow: Float64Array | null,
  slot: number,
  columns: FigureColumns,
  row: number,
  ratedPowerKw: number,
  hasDriveToday: boolean,
): number {
  const { price, demandCharge, co2Factor, discountRate, escalation } = context;
  const option = OPTIONS[slot]!;
  const annualKwh = physics.annualKwh[slot]!;
  const peakCurrent = physics.peakCurrent[slot]!;
  const peakKva = physics.peakKva[slot]!;
  const energyCost = annualKwh * price;
  const demandCost = annualDemandCost(physics.peakKw[slot]!, demandCharge);
  const annualCost = energyCost + demandCost;
  const savingsKwh = baseline.kwh - annualKwh;
  const savingsCost = baseline.cost - annualCost;
  const capex = memoCapex(context, capexRow, slot, option, ratedPowerKw, hasDriveToday);
  const lifeYears = context.lifeYearsBySlot[slot]!;
  // The savings series CF_t = S·(1+g)^(t−1) is used in closed form or summed on the fly, never built.
  checkSavingsCashFlows(capex, lifeYears, escalation);
  const isBaseline = slot === 0;
  const life = lifeFactors(lifeYears, discountRate, escalation);
  const lcc = capex + presentValueWithFactor(annualCost, life.series); // lifeCycleCost, with the power computed once per life
  columns.ratedEfficiencyPct[row] = round2(physics.ratedEfficiency[slot]! * 100);
  columns.lifeYears[row] = lifeYears;
  columns.annualKwh[row] = round1(annualKwh);
  columns.peakKw[row] = round3(physics.peakKw[slot]!);
  columns.energyCost[row] = roundMoney(energyCost);
  columns.demandCost[row] = roundMoney(demandCost);
  columns.annualCost[row] = roundMoney(annualCost);
  columns.annualCo2Kg[row] = round1(annualKwh * co2Factor);
  columns.savingsKwh[row] = round1(savingsKwh);
  columns.savingsCost[row] = roundMoney(savingsCost);
  columns.co2SavedKg[row] = round1(savingsKwh * co2Factor);
  columns.capex[row] = roundMoney(capex);
  columns.simplePaybackYears[row] = isBaseline ? Number.NaN : round2OrNaN(simplePaybackYears(capex, savingsCost));
  columns.discountedPaybackYears[row] = isBaseline ? Number.NaN : round2OrNaN(discountedPaybackOfEscalatingSavings(discountRate, capex, savingsCost, lifeYears, escalation));
  const npv = roundMoney(netPresentValueOfEscalatingSavings(capex, savingsCost, life.series, escalation));
  columns.npv[row] = npv;
  columns.irr[row] = isBaseline || !(savingsCost > 0) ? Number.NaN : round4OrNaN(internalRateOfReturnOfEscalatingSavings(capex, savingsCost, lifeYears, escalation));
  columns.lifeCycleCost[row] = roundMoney(lcc);
  columns.equivalentAnnualCost[row] = roundMoney(lcc * life.capitalRecovery);
  columns.lineCurrentA[row] = round2(peakCurrent);
  columns.kva[row] = round3(peakKva);
  columns.lineCurrentReductionA[row] = round2(baseline.current - peakCurrent);
  columns.kvaReduction[row] = round3(baseline.kva - peakKva);
  return npv;
}

/** Sets every figure of a row to NaN (an option that does not apply, or a motor that failed). */
export function clearRow(columns: FigureColumns, row: number): void {
  columns.ratedEfficiencyPct[row] = Number.NaN;
  columns.lifeYears[row] = Number.NaN;
  columns.annualKwh[row] = Number.NaN;
  columns.peakKw[row] = Number.NaN;
  columns.energyCost[row] = Number.NaN;
  columns.demandCost[row] = Number.NaN;
  columns.annualCost[row] = Number.NaN;
  columns.annualCo2Kg[row] = Number.NaN;
  columns.savingsKwh[row] = Number.NaN;
  columns.savingsCost[row] = Number.NaN;
  columns.co2SavedKg[row] = Number.NaN;
  columns.capex[row] = Number.NaN;
  columns.simplePaybackYears[row] = Number.NaN;
  columns.discountedPaybackYears[row] = Number.NaN;
  columns.npv[row] = Number.NaN;
  columns.irr[row] = Number.NaN;
  columns.lifeCycleCost[row] = Number.NaN;
  columns.equivalentAnnualCost[row] = Number.NaN;
  columns.lineCurrentA[row] = Number.NaN;
  columns.kva[row] = Number.NaN;
  columns.lineCurrentReductionA[row] = Number.NaN;
  columns.kvaReduction[row] = Number.NaN;
}

/** Source text of an induction option's rated efficiency (built only when recording). */
function inductionSource(
  family: Exclude<OptionFamily, 'bldc'>,
  original: ClassEfficiency,
  rewinds: number,
  rewindPenalty: number,
  ie3: ClassEfficiency,
  ie4: ClassEfficiency,
  ie5: ClassEfficiency,
): string {
  switch (family) {
    case 'keep':
      return rewinds > 0 ? `${original.source}, less ${rewinds} rewind(s)` : original.source;
    case 'rewind':
      return `today's efficiency less one more rewind (${rewindPenalty} points)`;
    case 'ie3':
      return ie3.source;
    case 'ie4':
      return ie4.source;
    default:
      return ie5.source;
  }
}
