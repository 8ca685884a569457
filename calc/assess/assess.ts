/**
 * The assessment of one motor: what it loses today and what each retrofit option would save, in
 * energy, money, CO2 and line current, with the assumptions behind each figure. The numbers come from
 * the shared core (calc/assess/engine.ts), which `screenMotors` uses too; this module builds the
 * plain JSON result around them.
 */
import {
  OPTION_SLOTS,
  assessMotorInto,
  assessmentContext,
  figureColumns,
  motorSummary,
  round,
  round2,
  type Assumption,
  type BinResult,
  type MotorSummary,
  type Recording,
} from './engine.js';
import { OPTIONS, type OptionCode } from './options.js';
import type { AssumptionsInput, MotorInput, PriceBookInput, SiteInput } from './schema.js';

export type { Assumption, BinResult } from './engine.js';

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
  /** The motor as assessed: its tag and rating, and what the core resolved (MotorSummary's fields). */
  motor: { tag: string | null; ratedPowerKw: number } & Pick<
    MotorSummary,
    'poles' | 'frequencyHz' | 'voltageV' | 'application' | 'controlMethod' | 'efficiencyPct' | 'powerFactor' | 'annualHours'
  >;
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

/** The core's figure rows of one assessment (module scratch: read into the result before the next call). */
const rows = figureColumns(OPTION_SLOTS);

/** Scratch of `assess` (filled and read within one call). */
const scratchRecording: Recording = { used: [], withBins: true, bins: new Array<BinResult[]>(OPTION_SLOTS), optionAssumptions: new Array<Assumption[]>(OPTION_SLOTS) };
const scratchSummary = motorSummary();

/** A figure reported as null: NaN in the core's column. */
const orNull = (value: number): number | null => (Number.isNaN(value) ? null : value);

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
  const context = assessmentContext(site, priceBook, assumptions, true, false);
  // The recording and summary are module scratch; what goes into the result (the assumption list,
  // each option's bins and assumptions) is new for every call.
  const recording = scratchRecording;
  recording.used = [];
  recording.withBins = options?.detail !== 'totals';
  const summary = scratchSummary;
  assessMotorInto(motor, context, rows, 0, summary, recording);

  const results = new Array<OptionResult>(summary.speedControl ? OPTION_SLOTS : OPTION_SLOTS / 2);
  for (let slot = 0; slot < results.length; slot += 1) {
    const option = OPTIONS[slot]!;
    results[slot] = {
      code: option.code,
      label: option.label,
      ratedEfficiencyPct: rows.ratedEfficiencyPct[slot]!,
      lifeYears: rows.lifeYears[slot]!,
      annualKwh: rows.annualKwh[slot]!,
      peakKw: rows.peakKw[slot]!,
      energyCost: rows.energyCost[slot]!,
      demandCost: rows.demandCost[slot]!,
      annualCost: rows.annualCost[slot]!,
      annualCo2Kg: rows.annualCo2Kg[slot]!,
      savingsKwh: rows.savingsKwh[slot]!,
      savingsCost: rows.savingsCost[slot]!,
      co2SavedKg: rows.co2SavedKg[slot]!,
      capex: rows.capex[slot]!,
      simplePaybackYears: orNull(rows.simplePaybackYears[slot]!),
      discountedPaybackYears: orNull(rows.discountedPaybackYears[slot]!),
      npv: rows.npv[slot]!,
      irr: orNull(rows.irr[slot]!),
      lifeCycleCost: rows.lifeCycleCost[slot]!,
      equivalentAnnualCost: rows.equivalentAnnualCost[slot]!,
      lineCurrentA: rows.lineCurrentA[slot]!,
      kva: rows.kva[slot]!,
      lineCurrentReductionA: rows.lineCurrentReductionA[slot]!,
      kvaReduction: rows.kvaReduction[slot]!,
      bins: recording.bins[slot]!,
      assumptions: recording.optionAssumptions[slot]!,
    };
  }

  // Recommendation: the highest NPV above zero (the core's slot), with the reason.
  const discountPct = context.discountRate * 100;
  const currency = context.currency;
  const unit = currency ? ` ${currency}` : '';
  // The slots of the options that apply are 0…5, or 0…11: a result's index is its slot.
  const best = summary.recommendedSlot > 0 ? results[summary.recommendedSlot]! : null;
  const recommended = best
    ? {
        code: best.code,
        reason: `highest NPV, ${toFixed0(best.npv)}${unit} over ${best.lifeYears} years at ${round2(discountPct)} %/a; saves ${toFixed0(best.savingsCost)}${unit} and ${toFixed0(best.savingsKwh)} kWh a year, simple payback ${best.simplePaybackYears ?? '–'} years`,
      }
    : { code: 'keep' as OptionCode, reason: `no option has a positive NPV at ${round(discountPct, 2)} %/a; keep the motor and review at its next failure` };

  return {
    currency,
    motor: {
      tag: motor.tag ?? null,
      ratedPowerKw: motor.ratedPowerKw,
      poles: summary.poles,
      frequencyHz: summary.frequencyHz,
      voltageV: summary.voltageV,
      application: summary.application,
      controlMethod: summary.controlMethod,
      efficiencyPct: summary.efficiencyPct,
      powerFactor: summary.powerFactor,
      annualHours: summary.annualHours,
    },
    baseline: results[0]!,
    options: results,
    recommended,
    assumptions: recording.used,
  };
}
