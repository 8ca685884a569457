/**
 * The assessment of one motor: what it loses today and what each retrofit option would save, in
 * energy, money, CO2 and line current, with the assumptions behind each figure. It only composes the
 * domain functions of calc/efficiency, calc/loads, calc/drives, calc/electrical and calc/economics.
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
import {
  DEFAULT_PUMP_STATIC_HEAD_FRACTION,
  flowOperatingPoint,
  speedControlApplies,
  type Application,
  type ControlMethod,
} from '../loads/fans-pumps.js';
import { powerFactorFromNameplate } from '../electrical/line-current.js';
import {
  capitalRecoveryFactor,
  discountedPaybackYears,
  escalatingSeriesFactor,
  fillSavingsCashFlows,
  internalRateOfReturn,
  netPresentValue,
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
import { OPTIONS, type OptionCode, type OptionDefinition, type OptionFamily } from './options.js';
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

/** Figures of one option; money in the site's currency, rounded once to cents. */
export interface OptionResult {
  code: OptionCode;
  label: string;
  /** Efficiency of the option at rated load, drive excluded [%]. */
  ratedEfficiencyPct: number;
  lifeYears: number;
  annualKwh: number;
  /** Highest input power over the bins that run [kW]. */
  peakKw: number;
  energyCost: number;
  demandCost: number;
  /** energyCost + demandCost [currency/a]. */
  annualCost: number;
  annualCo2Kg: number;
  savingsKwh: number;
  savingsCost: number;
  co2SavedKg: number;
  capex: number;
  simplePaybackYears: number | null;
  discountedPaybackYears: number | null;
  npv: number;
  /** Internal rate of return [-] (0.25 = 25 %/a); null when there is none. */
  irr: number | null;
  lifeCycleCost: number;
  /** lifeCycleCost × capital recovery factor: comparable across lives [currency/a]. */
  equivalentAnnualCost: number;
  /** Line current at the bin of highest current [A]. */
  lineCurrentA: number;
  /** Apparent power at that bin [kVA]. */
  kva: number;
  /** Baseline line current − this option's [A] (feeder capacity freed). */
  lineCurrentReductionA: number;
  kvaReduction: number;
  bins: BinResult[];
  assumptions: Assumption[];
}

export interface AssessResult {
  currency: string | null;
  motor: {
    tag: string | null;
    ratedPowerKw: number;
    poles: Poles;
    frequencyHz: 50 | 60;
    voltageV: number;
    application: Application;
    controlMethod: ControlMethod;
    /** Rated efficiency used for today's motor, rewinds included [%]. */
    efficiencyPct: number;
    powerFactor: number;
    annualHours: number;
  };
  baseline: OptionResult;
  options: OptionResult[];
  recommended: { code: OptionCode; reason: string };
  assumptions: Assumption[];
}

/** How much detail `assess` returns. */
export interface AssessOptions {
  /**
   * 'full' (default): every option lists its per-bin figures (`bins`). 'totals': `bins` is left
   * empty, for screening many motors; every other figure is the same as with 'full'.
   */
  detail?: 'full' | 'totals' | undefined;
}

/** Internal per-bin operating point, shared by the options with the same flow control. */
interface OperatingPoint {
  fraction: number;
  hours: number;
  runHours: number;
  shaftKw: number;
  speedFraction: number;
  torqueFraction: number;
  /** The BinResult figures that do not depend on the option, rounded once per point, not per option. */
  runHoursRounded: number;
  shaftKwRounded: number;
  loadFractionRounded: number;
  speedFractionRounded: number;
}

/** How one option turns shaft power into input power. */
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
  assumptions: Assumption[];
}

/** Powers of ten by decimals, so rounding needs no Math.pow in the hot path. */
const SCALES = [1, 10, 100, 1000, 10000] as const;
const round = (value: number, decimals: 0 | 1 | 2 | 3 | 4): number => Math.round(value * SCALES[decimals]) / SCALES[decimals];
const roundOrNull = (value: number | null, decimals: 0 | 1 | 2 | 3 | 4): number | null => (value === null ? null : round(value, decimals));
// The same rounding with the scale as a literal: the per-bin loop calls these about 400 times a
// motor, and a constant operand spares the table load (results are bit for bit those of `round`).
const round1 = (value: number): number => Math.round(value * 10) / 10;
const round2 = (value: number): number => Math.round(value * 100) / 100;
const round3 = (value: number): number => Math.round(value * 1000) / 1000;
const round4 = (value: number): number => Math.round(value * 10000) / 10000;
const round2OrNull = (value: number | null): number | null => (value === null ? null : round2(value));
const round4OrNull = (value: number | null): number | null => (value === null ? null : round4(value));

/**
 * `value.toFixed(0)`, exactly (same string for every number), without the general fixed-point
 * conversion that made the recommendation's reason one of the costlier lines of `assess`: an
 * integer prints as itself; otherwise the integer part is rounded half up on the magnitude, which
 * is what toFixed does (ECMA-262 Number.prototype.toFixed: the larger n on a tie, sign put back).
 */
function toFixed0(value: number): string {
  const magnitude = Math.abs(value);
  if (!(magnitude < 9007199254740992)) return value.toFixed(0); // 2^53: above it toFixed prints exact digits, String the shortest
  if (Number.isInteger(value)) return integerString(value);
  const whole = Math.floor(magnitude); // below 2^53 the fraction magnitude − whole is exact
  const rounded = magnitude - whole >= 0.5 ? whole + 1 : whole;
  return value < 0 ? `-${integerString(rounded)}` : integerString(rounded);
}

/** String of an integer-valued number; as a small integer it takes the engine's number-string cache. */
function integerString(value: number): string {
  return value >= -2147483648 && value <= 2147483647 && !Object.is(value, -0) ? String(value | 0) : String(value);
}

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

/** Σ hours of the bins [h/a], added in order (as a reduce from 0 would). */
function sumHours(bins: readonly { hours: number }[]): number {
  let sum = 0;
  for (let index = 0; index < bins.length; index += 1) sum += bins[index]!.hours;
  return sum;
}

function resolvePoles(motor: MotorInput, frequencyHz: number): { poles: Poles; derived: boolean } {
  if (motor.poles !== undefined) {
    if (!POLES.includes(motor.poles)) throw new CalcInputError('motor.poles', 'must be 2, 4, 6 or 8');
    return { poles: motor.poles, derived: false };
  }
  if (motor.speedRpm === undefined) throw new CalcInputError('motor.poles', 'or speedRpm is required');
  for (const poles of POLES) {
    const synchronous = (120 * frequencyHz) / poles;
    if (motor.speedRpm < synchronous && motor.speedRpm > 0.8 * synchronous) return { poles, derived: true };
  }
  throw new CalcInputError('motor.speedRpm', `matches no 2-, 4-, 6- or 8-pole induction motor at ${frequencyHz} Hz`);
}

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

function optionLife(option: OptionDefinition, lives: Record<OptionFamily | 'vsd', number>): number {
  const family = lives[option.family];
  return option.speedControl ? Math.min(family, lives.vsd) : family;
}

/** The motor's fixed data the option models share. */
interface MotorContext {
  ratedPowerKw: number;
  voltageV: number;
  ratedPowerFactor: number;
  sinPhi: number;
}

function inductionModel(context: MotorContext, efficiency: number, source: string, driveClass: DriveClass | null): OptionModel {
  return {
    ratedEfficiency: efficiency,
    split: lossSplit(context.ratedPowerKw, efficiency, INDUCTION_CONSTANT_LOSS_SHARE),
    curve: null,
    fullLoadReactiveKvar: (context.ratedPowerKw / efficiency) * (context.sinPhi / context.ratedPowerFactor),
    noLoadCurrentShare: INDUCTION_MAGNETISING_REACTIVE_SHARE * context.sinPhi,
    isPermanentMagnet: false,
    driveClass,
    driveFullLoadLossKw: driveClass ? driveFullLoadLossKw(context.ratedPowerKw, driveClass) : 0,
    assumptions: [{ what: 'rated efficiency [%]', value: round(efficiency * 100, 2), source }],
  };
}

/** Operating points of every bin under one flow-control method. */
function operatingPoints(
  bins: readonly { fraction: number; hours: number }[],
  method: ControlMethod,
  isFlowLoad: boolean,
  designLoad: number,
  staticHead: number,
  ratedPowerKw: number,
): OperatingPoint[] {
  const points = new Array<OperatingPoint>(bins.length);
  for (let index = 0; index < bins.length; index += 1) {
    const bin = bins[index]!;
    if (!isFlowLoad) {
      points[index] = pointWithRounding(bin.fraction, bin.hours, bin.hours, bin.fraction * ratedPowerKw, 1, bin.fraction, ratedPowerKw);
      continue;
    }
    const point = flowOperatingPoint(method, bin.fraction, staticHead);
    const load = designLoad * point.powerFraction;
    if (load > 1.25) throw new CalcInputError(`motor.dutyProfile.${index}.fraction`, 'gives a shaft load above 125 % of rated');
    points[index] = pointWithRounding(
      bin.fraction,
      bin.hours,
      bin.hours * point.runFraction,
      load * ratedPowerKw,
      point.speedFraction,
      point.speedFraction > 0 ? load / point.speedFraction : 0,
      ratedPowerKw,
    );
  }
  return points;
}

function pointWithRounding(fraction: number, hours: number, runHours: number, shaftKw: number, speedFraction: number, torqueFraction: number, ratedPowerKw: number): OperatingPoint {
  return {
    fraction,
    hours,
    runHours,
    shaftKw,
    speedFraction,
    torqueFraction,
    runHoursRounded: round2(runHours),
    shaftKwRounded: round4(shaftKw),
    loadFractionRounded: round4(shaftKw / ratedPowerKw),
    speedFractionRounded: round4(speedFraction),
  };
}

/** An option's physics before money: per-bin results and the totals. */
interface OptionPhysics {
  bins: BinResult[];
  annualKwh: number;
  peakKw: number;
  peakCurrent: number;
  peakKva: number;
}

const SQRT3 = Math.sqrt(3);

/**
 * Input power, power factor and current of one option at every bin:
 * P_in = P_shaft + P_loss,motor(s, t) [+ P_loss,drive(c)], I = P_in/(√3·V·PF).
 */
function evaluateOption(model: OptionModel, points: readonly OperatingPoint[], context: MotorContext, withBins: boolean): OptionPhysics {
  const { ratedPowerKw, voltageV } = context;
  const bins = withBins ? new Array<BinResult>(points.length) : null;
  let annualKwh = 0;
  let peakKw = 0;
  let peakCurrent = 0;
  let peakKva = 0;
  for (let index = 0; index < points.length; index += 1) {
    const point = points[index]!;
    let inputKw = 0;
    let powerFactor = 0;
    const running = point.runHours > 0 && point.speedFraction > 0;
    if (running) {
      if (model.curve) {
        const reading = readPartLoadCurve(model.curve, point.shaftKw / model.curve.ratedPowerKw);
        inputKw = point.shaftKw / reading.efficiency;
        powerFactor = reading.powerFactor;
      } else {
        const motorInputKw = point.shaftKw + machineLossKw(model.split!, point.speedFraction, point.torqueFraction);
        if (model.driveClass) {
          const t = point.torqueFraction;
          const m = model.noLoadCurrentShare;
          // Motor current / rated: ∝ torque for a PM motor; magnetising part in quadrature for an induction motor.
          const currentFraction = model.isPermanentMagnet ? t : Math.sqrt(m * m + (1 - m * m) * t * t);
          inputKw = motorInputKw + driveLossFromFullLoadKw(model.driveFullLoadLossKw, currentFraction);
          powerFactor = driveInputPowerFactor(Math.min((motorInputKw * model.ratedEfficiency) / ratedPowerKw, 1.5));
        } else {
          inputKw = motorInputKw;
          const reactive = inductionReactiveKvar(model.fullLoadReactiveKvar, 1, point.torqueFraction);
          powerFactor = inputKw / Math.sqrt(inputKw * inputKw + reactive * reactive);
        }
      }
    }
    const kva = powerFactor > 0 ? inputKw / powerFactor : 0;
    const currentA = (1000 * kva) / (SQRT3 * voltageV); // I = P/(√3·V·PF)
    if (running) {
      annualKwh += inputKw * point.runHours;
      if (inputKw > peakKw) peakKw = inputKw;
      if (currentA > peakCurrent) {
        peakCurrent = currentA;
        peakKva = kva;
      }
    }
    if (bins === null) continue;
    bins[index] = {
      fraction: point.fraction,
      hours: point.hours,
      runHours: point.runHoursRounded,
      shaftKw: point.shaftKwRounded,
      loadFraction: point.loadFractionRounded,
      speedFraction: point.speedFractionRounded,
      inputKw: round4(inputKw),
      efficiency: inputKw > 0 ? round4(point.shaftKw / inputKw) : 0,
      powerFactor: round3(powerFactor),
      currentA: round2(currentA),
      kva: round3(kva),
    };
  }
  return { bins: bins ?? [], annualKwh, peakKw, peakCurrent, peakKva };
}

/** Capital recovery and present-worth factors of one life at one rate and escalation. */
interface LifeFactors {
  capitalRecovery: number;
  series: EscalatingSeriesFactor;
}

/**
 * Factors by life [a] for the last (rate, escalation) seen: options share three or four lives and
 * most calls share the default rates, so the two powers are computed once, not twice per option.
 * Module scratch like the IRR's slope: a pure memo, the values are those of the functions it calls.
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

/** What the money side of every option shares. */
interface EconomicContext {
  price: number;
  demandCharge: number;
  co2Factor: number;
  discountRate: number;
  escalation: number;
  lives: Record<OptionFamily | 'vsd', number>;
  book: PriceBook;
  ratedPowerKw: number;
  hasDriveToday: boolean;
  baselineKwh: number;
  baselineCost: number;
  baselineCurrent: number;
  baselineKva: number;
}

/** Energy, cost, CO2, capex and the investment figures of one option, money rounded once here. */
function optionResult(option: OptionDefinition, model: OptionModel, physics: OptionPhysics, economy: EconomicContext): OptionResult {
  const { annualKwh, peakKw, peakCurrent, peakKva } = physics;
  const energyCost = annualKwh * economy.price;
  const demandCost = annualDemandCost(peakKw, economy.demandCharge);
  const annualCost = energyCost + demandCost;
  const savingsKwh = economy.baselineKwh - annualKwh;
  const savingsCost = economy.baselineCost - annualCost;
  const capex = optionCapex(option, economy.book, economy.ratedPowerKw, economy.hasDriveToday);
  const lifeYears = optionLife(option, economy.lives);
  // A reused buffer: every figure below reads it before the next option overwrites it.
  const flows = fillSavingsCashFlows(capex, savingsCost, lifeYears, economy.escalation);
  const isBaseline = option.code === 'keep';
  const life = lifeFactors(lifeYears, economy.discountRate, economy.escalation);
  const lcc = capex + presentValueWithFactor(annualCost, life.series); // lifeCycleCost, with the power computed once per life
  return {
    code: option.code,
    label: option.label,
    ratedEfficiencyPct: round2(model.ratedEfficiency * 100),
    lifeYears,
    annualKwh: round1(annualKwh),
    peakKw: round3(peakKw),
    energyCost: roundMoney(energyCost),
    demandCost: roundMoney(demandCost),
    annualCost: roundMoney(annualCost),
    annualCo2Kg: round1(annualKwh * economy.co2Factor),
    savingsKwh: round1(savingsKwh),
    savingsCost: roundMoney(savingsCost),
    co2SavedKg: round1(savingsKwh * economy.co2Factor),
    capex: roundMoney(capex),
    simplePaybackYears: isBaseline ? null : round2OrNull(simplePaybackYears(capex, savingsCost)),
    discountedPaybackYears: isBaseline ? null : round2OrNull(discountedPaybackYears(economy.discountRate, flows)),
    npv: roundMoney(netPresentValue(economy.discountRate, flows)),
    irr: isBaseline || !(savingsCost > 0) ? null : round4OrNull(internalRateOfReturn(flows)),
    lifeCycleCost: roundMoney(lcc),
    equivalentAnnualCost: roundMoney(lcc * life.capitalRecovery),
    lineCurrentA: round2(peakCurrent),
    kva: round3(peakKva),
    lineCurrentReductionA: round2(economy.baselineCurrent - peakCurrent),
    kvaReduction: round3(economy.baselineKva - peakKva),
    bins: physics.bins,
    assumptions:
      model.driveClass && option.family !== 'bldc'
        ? [...model.assumptions, { what: 'drive class (IEC 61800-9-2)', value: model.driveClass, source: option.speedControl ? 'new drive' : 'drive fitted today' }]
        : model.assumptions,
  };
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
 * Assesses one motor against every retrofit option.
 *
 * @param motor the motor in DESIGN.md's vocabulary (parsed by `motorSchema`): ratedPowerKw [kW],
 *   poles or speedRpm [rpm], voltageV [V] and frequencyHz [Hz] (else the site's), efficiencyClass or
 *   nameplateEfficiencyPct [%], powerFactor [-] or ratedCurrentA [A], application, controlMethod,
 *   hoursPerYear [h/a] and loadFactor [-] or dutyProfile [{fraction [-], hours [h/a]}], rewinds,
 *   yearInstalled, staticHeadFraction [-], driveClass, bldcCurve (a PartLoadCurve that replaces the
 *   generic BLDC model)
 * @param site energyPricePerKwh [currency/kWh] or timeOfUse, demandChargePerKwMonth
 *   [currency/(kW·month)], co2KgPerKwh [kg/kWh], currency, voltageV [V], frequencyHz [Hz],
 *   defaultHoursPerYear [h/a]
 * @param priceBook optional; each part missing falls back to DEFAULT_PRICE_BOOK
 * @param assumptions optional overrides of the defaults in calc/assess/defaults.ts
 * @param options optional; `detail: 'totals'` leaves every option's `bins` empty (screening), else
 *   they are filled (AssessOptions)
 * @returns baseline ('keep'), every applicable option (OptionResult), the recommendation (highest
 *   NPV above zero, else 'keep') with its reason, and the assumptions used. Plain JSON data.
 *
 * Per bin: P_in = P_shaft + P_loss,motor(s, t) + P_loss,drive(c); E = Σ P_in·h_run;
 * cost = E·price + peak·demand·12; savings = baseline − option; NPV, IRR, paybacks and LCC over the
 * option's life with escalating savings. Sources: see each domain function.
 * @throws CalcInputError naming the field for input that breaks a rule.
 */
export function assess(motor: MotorInput, site: SiteInput, priceBook?: PriceBookInput, assumptions?: AssumptionsInput, options?: AssessOptions): AssessResult {
  const withBins = options?.detail !== 'totals';
  const used: Assumption[] = [];
  const ratedPowerKw = motor.ratedPowerKw;
  requireInRange('motor.ratedPowerKw', ratedPowerKw, 0.12, 1000);

  // Supply.
  const frequencyHz = motor.frequencyHz ?? site.frequencyHz;
  if (frequencyHz === undefined) throw new CalcInputError('motor.frequencyHz', 'is required unless site.frequencyHz is given');
  if (frequencyHz !== 50 && frequencyHz !== 60) throw new CalcInputError('motor.frequencyHz', 'must be 50 or 60');
  const voltageV = motor.voltageV ?? site.voltageV;
  if (voltageV === undefined) throw new CalcInputError('motor.voltageV', 'is required unless site.voltageV is given');
  if (!(voltageV > 0)) throw new CalcInputError(motor.voltageV === undefined ? 'site.voltageV' : 'motor.voltageV', 'must be positive');
  if (motor.voltageV === undefined) used.push({ what: 'supply voltage', value: voltageV, source: "site's voltage [V]" });
  if (motor.frequencyHz === undefined) used.push({ what: 'supply frequency', value: frequencyHz, source: "site's frequency [Hz]" });
  const { poles, derived } = resolvePoles(motor, frequencyHz);
  if (derived) used.push({ what: 'poles', value: poles, source: `from speedRpm ${motor.speedRpm} below the synchronous speed ${(120 * frequencyHz) / poles} rpm` });

  // Assumption values.
  const discountRate = (assumptions?.discountRatePct ?? DEFAULT_DISCOUNT_RATE_PCT) / 100;
  const escalation = (assumptions?.energyEscalationPct ?? DEFAULT_ENERGY_ESCALATION_PCT) / 100;
  // Read only below, so the defaults need no copy when no life is given.
  const lives = (assumptions?.lifeYears === undefined ? DEFAULT_OPTION_LIFE_YEARS : { ...DEFAULT_OPTION_LIFE_YEARS, ...assumptions.lifeYears }) as Record<OptionFamily | 'vsd', number>;
  const rewindPenalty = assumptions?.rewindPenaltyPctPoints ?? REWIND_PENALTY_PCT_POINTS;
  const newDriveClass = assumptions?.newDriveClass ?? DEFAULT_NEW_DRIVE_CLASS;
  used.push(
    assumptions?.discountRatePct === undefined ? DEFAULT_ENTRIES.discount : { what: 'discount rate [%/a]', value: assumptions.discountRatePct, source: 'given' },
    assumptions?.energyEscalationPct === undefined ? DEFAULT_ENTRIES.escalation : { what: 'energy price escalation [%/a]', value: assumptions.energyEscalationPct, source: 'given' },
    assumptions?.lifeYears === undefined ? DEFAULT_ENTRIES.lives : { what: 'lives of the options [a]', value: JSON.stringify(lives), source: 'given, others DEFAULT_OPTION_LIFE_YEARS' },
  );

  // Tariff.
  const price = effectiveEnergyPrice(site.energyPricePerKwh, site.timeOfUse);
  const demandCharge = site.demandChargePerKwMonth ?? 0;
  const co2Factor = site.co2KgPerKwh ?? assumptions?.co2KgPerKwh ?? DEFAULT_GRID_CO2_KG_PER_KWH;
  used.push(
    { what: 'energy price [currency/kWh]', value: price, source: site.timeOfUse ? 'time-of-use table, running hours spread by hoursShare' : "site's flat price" },
    { what: 'demand charge [currency/(kW·month)]', value: demandCharge, source: site.demandChargePerKwMonth === undefined ? 'none given' : "site's demand charge, motor peak coincident with the site's" },
    {
      what: 'grid CO2 factor [kg/kWh]',
      value: co2Factor,
      source: site.co2KgPerKwh !== undefined ? "site's factor" : assumptions?.co2KgPerKwh !== undefined ? 'given in assumptions' : 'DEFAULT_GRID_CO2_KG_PER_KWH (value from memory)',
    },
  );
  const book = mergePriceBook(priceBook);
  if (book.currency !== undefined && site.currency !== undefined && book.currency !== site.currency) {
    throw new CalcInputError('priceBook.currency', `must equal site.currency (${site.currency})`);
  }
  used.push(priceBook ? { what: 'price book', value: 'given', source: 'given; missing items from DEFAULT_PRICE_BOOK' } : DEFAULT_ENTRIES.priceBook);

  // Today's motor: rated efficiency.
  const rewinds = motor.rewinds ?? 0;
  if (!Number.isInteger(rewinds) || rewinds < 0 || rewinds > 10) throw new CalcInputError('motor.rewinds', 'must be a whole number from 0 to 10');
  let original: ClassEfficiency;
  const efficiencyClass = motor.efficiencyClass ?? 'unknown';
  if (motor.nameplateEfficiencyPct !== undefined) {
    requireInRange('motor.nameplateEfficiencyPct', motor.nameplateEfficiencyPct, 1, 99.9);
    original = { efficiencyPct: motor.nameplateEfficiencyPct, source: 'nameplate efficiency (wins over the class value)' };
  } else if (efficiencyClass === 'unknown') {
    if (motor.yearInstalled !== undefined && motor.yearInstalled >= CLASS_REGIME_START_YEAR) {
      const ie2 = memoIecClassEfficiency(ratedPowerKw, poles, frequencyHz, 'IE2');
      original = { efficiencyPct: ie2.efficiencyPct, source: `unknown class, installed ${motor.yearInstalled} ≥ ${CLASS_REGIME_START_YEAR}: IE2 minimum assumed; ${ie2.source}` };
    } else {
      const lossFactor = assumptions?.unknownClassLossFactor;
      original = lossFactor === undefined ? memoUnknownClassEfficiency(ratedPowerKw, poles, frequencyHz) : unknownClassEfficiency(ratedPowerKw, poles, frequencyHz, lossFactor);
    }
  } else if (efficiencyClass === 'IE1' || efficiencyClass === 'IE2' || efficiencyClass === 'IE3' || efficiencyClass === 'IE4' || efficiencyClass === 'IE5') {
    original = memoIecClassEfficiency(ratedPowerKw, poles, frequencyHz, efficiencyClass);
  } else {
    throw new CalcInputError('motor.efficiencyClass', 'must be one of IE1, IE2, IE3, IE4, IE5, unknown');
  }
  const baseEfficiency = rewoundEfficiency(original.efficiencyPct / 100, rewinds, rewindPenalty);
  used.push({ what: "today's rated efficiency before rewinds [%]", value: original.efficiencyPct, source: original.source });
  if (rewinds > 0) {
    used.push({ what: 'efficiency lost per rewind [percentage points]', value: rewindPenalty, source: assumptions?.rewindPenaltyPctPoints === undefined ? 'REWIND_PENALTY_PCT_POINTS (common practice)' : 'given' });
  }

  // Power factor of the induction motors at rated load.
  let ratedPowerFactor: number;
  if (motor.powerFactor !== undefined) {
    requireInRange('motor.powerFactor', motor.powerFactor, 0.05, 1);
    ratedPowerFactor = motor.powerFactor;
    used.push({ what: 'rated power factor', value: ratedPowerFactor, source: 'nameplate' });
  } else if (motor.ratedCurrentA !== undefined && motor.voltageV !== undefined) {
    ratedPowerFactor = powerFactorFromNameplate(ratedPowerKw, original.efficiencyPct / 100, motor.voltageV, motor.ratedCurrentA);
    used.push({ what: 'rated power factor', value: round(ratedPowerFactor, 3), source: 'from nameplate power, efficiency, voltage and current: P/η/(√3·V·I)' });
  } else {
    ratedPowerFactor = typicalRatedPowerFactor(ratedPowerKw, poles);
    used.push({ what: 'rated power factor', value: ratedPowerFactor, source: 'typical value for the rating and poles (common practice, values from memory)' });
  }
  used.push({ what: 'rated power factor of new induction motors', value: round(ratedPowerFactor, 3), source: "same as today's motor (assumption)" });

  // Load: duty profile or one bin.
  const application: Application = motor.application ?? 'other';
  const controlMethod: ControlMethod = motor.controlMethod ?? 'direct-on-line';
  const isFlowLoad = application === 'fan' || application === 'pump';
  const hasDriveToday = controlMethod === 'variable-speed-drive';
  let bins: { fraction: number; hours: number }[];
  if (motor.dutyProfile !== undefined && motor.dutyProfile.length > 0) {
    let total = 0;
    for (let index = 0; index < motor.dutyProfile.length; index += 1) {
      const bin = motor.dutyProfile[index]!;
      // The same checks as requireInRange, with the field name built only when one fails.
      if (!(bin.fraction >= 0 && bin.fraction <= 1.25)) requireInRange(`motor.dutyProfile.${index}.fraction`, bin.fraction, 0, 1.25);
      if (!(bin.hours >= 0 && bin.hours <= MAX_HOURS_PER_YEAR)) requireInRange(`motor.dutyProfile.${index}.hours`, bin.hours, 0, MAX_HOURS_PER_YEAR);
      total += bin.hours;
    }
    if (total > MAX_HOURS_PER_YEAR) throw new CalcInputError('motor.dutyProfile', `hours must add up to ${MAX_HOURS_PER_YEAR} or less`);
    bins = motor.dutyProfile;
    used.push({ what: 'duty profile', value: `${bins.length} bins, ${total} h/a`, source: isFlowLoad ? 'given; fractions of design flow' : 'given; fractions of rated load' });
  } else {
    const hours = motor.hoursPerYear ?? site.defaultHoursPerYear ?? assumptions?.defaultHoursPerYear ?? DEFAULT_HOURS_PER_YEAR;
    requireInRange(motor.hoursPerYear !== undefined ? 'motor.hoursPerYear' : 'site.defaultHoursPerYear', hours, 0, MAX_HOURS_PER_YEAR);
    const hoursSource =
      motor.hoursPerYear !== undefined ? 'given' : site.defaultHoursPerYear !== undefined ? "site's default hours" : assumptions?.defaultHoursPerYear !== undefined ? 'given in assumptions' : 'DEFAULT_HOURS_PER_YEAR (two shifts, common practice)';
    used.push({ what: 'running hours [h/a]', value: hours, source: hoursSource });
    const loadFactor = motor.loadFactor ?? assumptions?.defaultLoadFactor ?? DEFAULT_LOAD_FACTOR;
    bins = [{ fraction: isFlowLoad ? 1 : loadFactor, hours }];
  }
  const designLoad = isFlowLoad ? (motor.loadFactor ?? assumptions?.defaultLoadFactor ?? DEFAULT_LOAD_FACTOR) : 1;
  requireInRange('motor.loadFactor', designLoad, 0, 1.25);
  if (isFlowLoad || motor.dutyProfile === undefined) {
    used.push({
      what: isFlowLoad ? 'motor load at design flow [-]' : 'load factor [-]',
      value: isFlowLoad ? designLoad : bins[0]!.fraction,
      source: motor.loadFactor !== undefined ? 'given' : assumptions?.defaultLoadFactor !== undefined ? 'given in assumptions' : 'DEFAULT_LOAD_FACTOR (US DOE motor-load fact sheet: typically 0.6–0.8)',
    });
  }
  const staticHead = application === 'pump' ? (motor.staticHeadFraction ?? DEFAULT_PUMP_STATIC_HEAD_FRACTION) : (motor.staticHeadFraction ?? 0);
  if (isFlowLoad) {
    used.push({ what: 'flow control today', value: controlMethod, source: 'given or direct-on-line (on/off) by default' }, DEFAULT_ENTRIES.flowCurves);
    if (application === 'pump') used.push({ what: 'static head / design head [-]', value: staticHead, source: motor.staticHeadFraction !== undefined ? 'given' : 'DEFAULT_PUMP_STATIC_HEAD_FRACTION (common practice)' });
  }

  const todayPoints = operatingPoints(bins, controlMethod, isFlowLoad, designLoad, staticHead, ratedPowerKw);
  const speedControl = speedControlApplies(application, controlMethod);
  const speedPoints = speedControl ? operatingPoints(bins, 'variable-speed-drive', isFlowLoad, designLoad, staticHead, ratedPowerKw) : null;

  // Option models.
  const existingDriveClass: DriveClass = motor.driveClass ?? DEFAULT_EXISTING_DRIVE_CLASS;
  if (hasDriveToday) used.push({ what: 'class of the drive fitted today (IEC 61800-9-2)', value: existingDriveClass, source: motor.driveClass ? 'given' : 'DEFAULT_EXISTING_DRIVE_CLASS (common practice)' });
  used.push(
    assumptions?.newDriveClass ? { what: 'class of a new drive (IEC 61800-9-2)', value: newDriveClass, source: 'given' } : DEFAULT_ENTRIES.newDrive,
    DEFAULT_ENTRIES.partLoad,
    DEFAULT_ENTRIES.size,
  );

  const context: MotorContext = { ratedPowerKw, voltageV, ratedPowerFactor, sinPhi: Math.sqrt(1 - ratedPowerFactor * ratedPowerFactor) };
  // Rated efficiency and its source for each induction option, computed once.
  const ie3 = memoIecClassEfficiency(ratedPowerKw, poles, frequencyHz, 'IE3');
  const ie4 = memoIecClassEfficiency(ratedPowerKw, poles, frequencyHz, 'IE4');
  const ie5 = memoIecClassEfficiency(ratedPowerKw, poles, frequencyHz, 'IE5');
  const inductionRatings: Record<Exclude<OptionFamily, 'bldc'>, { efficiency: number; source: string }> = {
    keep: { efficiency: baseEfficiency, source: rewinds > 0 ? `${original.source}, less ${rewinds} rewind(s)` : original.source },
    rewind: { efficiency: rewoundEfficiency(baseEfficiency, 1, rewindPenalty), source: `today's efficiency less one more rewind (${rewindPenalty} points)` },
    ie3: { efficiency: ie3.efficiencyPct / 100, source: ie3.source },
    ie4: { efficiency: ie4.efficiencyPct / 100, source: ie4.source },
    ie5: { efficiency: ie5.efficiencyPct / 100, source: ie5.source },
  };
  let bldcBase: OptionModel;
  if (motor.bldcCurve) {
    checkPartLoadCurve(motor.bldcCurve, 'motor.bldcCurve');
    const rated = readPartLoadCurve(motor.bldcCurve, 1);
    bldcBase = {
      ratedEfficiency: rated.efficiency,
      split: null,
      curve: motor.bldcCurve,
      fullLoadReactiveKvar: 0,
      noLoadCurrentShare: 0,
      isPermanentMagnet: true,
      driveClass: null,
      driveFullLoadLossKw: 0,
      assumptions: [{ what: 'BLDC model', value: 'part-load curve', source: `given curve: ${motor.bldcCurve.source} (motor and drive together, read at the shaft-load fraction)` }],
    };
  } else {
    bldcBase = {
      ratedEfficiency: ie5.efficiencyPct / 100,
      split: lossSplit(ratedPowerKw, ie5.efficiencyPct / 100, PM_CONSTANT_LOSS_SHARE),
      curve: null,
      fullLoadReactiveKvar: 0,
      noLoadCurrentShare: 0,
      isPermanentMagnet: true,
      driveClass: newDriveClass,
      driveFullLoadLossKw: driveFullLoadLossKw(ratedPowerKw, newDriveClass),
      assumptions: [
        { what: 'BLDC model', value: 'generic permanent-magnet part-load model at the IE5 level', source: bldcModelSource(ie5) },
        { what: 'BLDC drive class (IEC 61800-9-2)', value: newDriveClass, source: 'new drive' },
      ],
    };
  }
  const todayDrive = hasDriveToday ? existingDriveClass : null;
  // Evaluate every option, then its money.
  const evaluated: { option: OptionDefinition; model: OptionModel; physics: OptionPhysics }[] = [];
  for (const option of OPTIONS) {
    if (option.speedControl && !speedPoints) continue;
    let model = bldcBase;
    if (option.family !== 'bldc') {
      const rating = inductionRatings[option.family];
      model = inductionModel(context, rating.efficiency, rating.source, option.speedControl ? newDriveClass : todayDrive);
    }
    evaluated.push({ option, model, physics: evaluateOption(model, option.speedControl ? speedPoints! : todayPoints, context, withBins) });
  }
  const baselinePhysics = evaluated[0]!.physics;
  const economy: EconomicContext = {
    price,
    demandCharge,
    co2Factor,
    discountRate,
    escalation,
    lives,
    book,
    ratedPowerKw,
    hasDriveToday,
    baselineKwh: baselinePhysics.annualKwh,
    baselineCost: baselinePhysics.annualKwh * price + annualDemandCost(baselinePhysics.peakKw, demandCharge),
    baselineCurrent: baselinePhysics.peakCurrent,
    baselineKva: baselinePhysics.peakKva,
  };
  const results = new Array<OptionResult>(evaluated.length);
  for (let index = 0; index < evaluated.length; index += 1) {
    const { option, model, physics } = evaluated[index]!;
    results[index] = optionResult(option, model, physics, economy);
  }

  // Recommendation: the highest NPV above zero.
  let best: OptionResult | null = null;
  for (const result of results) {
    if (result.code !== 'keep' && result.npv > 0 && (best === null || result.npv > best.npv)) best = result;
  }
  const currency = site.currency ?? book.currency ?? null;
  const unit = currency ? ` ${currency}` : '';
  const recommended = best
    ? {
        code: best.code,
        reason: `highest NPV, ${toFixed0(best.npv)}${unit} over ${best.lifeYears} years at ${round2(discountRate * 100)} %/a; saves ${toFixed0(best.savingsCost)}${unit} and ${toFixed0(best.savingsKwh)} kWh a year, simple payback ${best.simplePaybackYears ?? '–'} years`,
      }
    : { code: 'keep' as OptionCode, reason: `no option has a positive NPV at ${round(discountRate * 100, 2)} %/a; keep the motor and review at its next failure` };

  return {
    currency,
    motor: {
      tag: motor.tag ?? null,
      ratedPowerKw,
      poles,
      frequencyHz,
      voltageV,
      application,
      controlMethod,
      efficiencyPct: round(baseEfficiency * 100, 2),
      powerFactor: round(ratedPowerFactor, 3),
      annualHours: sumHours(bins),
    },
    baseline: results[0]!,
    options: results,
    recommended,
    assumptions: used,
  };
}
