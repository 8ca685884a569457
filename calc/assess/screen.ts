/**
 * Screening: many motors of one site assessed at once, every option's figures written into
 * typed-array columns (struct of arrays) instead of result objects. The numbers are those of
 * `assess`, figure for figure (the same core, calc/assess/engine.ts, computes both); what a
 * screening leaves out is the text (assumption lists, sources, the recommendation's reason) and the
 * per-bin results. What depends only on the site, the price book and the assumptions is worked out
 * once per batch.
 */
import { CalcInputError } from '../errors.js';
import { OPTION_SLOTS, assessMotorInto, clearRow, assessmentContext, figureColumns, motorSummary, type AssessmentContext, type FigureColumns, type MotorSummary } from './engine.js';
import { OPTION_CODES, type OptionCode } from './options.js';
import type { AssumptionsInput, MotorInput, PriceBookInput, SiteInput } from './schema.js';

export { OPTION_FIGURES, OPTION_SLOTS, type FigureColumns, type OptionFigure } from './engine.js';

/** A motor of the batch that could not be assessed. */
export interface ScreeningError {
  /** Index of the motor in the batch [-]. */
  motorIndex: number;
  /** The field, as `assess` names it with the motor's place in the batch: "motors.17.ratedPowerKw". */
  field: string;
  /** `"field" rule`, as a CalcInputError's message. */
  message: string;
}

/** The figures of a batch of motors, column by column. */
export interface MotorScreening {
  /** Motors in the batch [-]. */
  motorCount: number;
  /** The option code of each slot (OPTION_CODES): row = motorIndex·OPTION_SLOTS + slot. */
  optionCodes: readonly OptionCode[];
  /**
   * One Float64Array per figure (OPTION_FIGURES), motorCount·OPTION_SLOTS rows, each value equal to
   * the same figure of `assess` for that motor and option. NaN where `assess` gives null, for an
   * option that does not apply to the motor (the speed-control slots 6–11 of a motor that gets
   * none) and for every slot of a motor that could not be assessed.
   */
  figures: FigureColumns;
  /** Slot of the recommended option per motor (0 = keep, as `assess`'s recommended.code); −1 for a motor in `errors`. */
  recommendedSlot: Int8Array;
  /** Options that apply per motor (6 or 12; 0 for a motor in `errors`) [-]. */
  optionCount: Uint8Array;
  /** `assess`'s motor.efficiencyPct per motor [%] (NaN for a motor in `errors`). */
  efficiencyPct: Float64Array;
  /** `assess`'s motor.powerFactor per motor [-]. */
  powerFactor: Float64Array;
  /** `assess`'s motor.annualHours per motor [h/a]. */
  annualHours: Float64Array;
  /** The motors that could not be assessed, by index, with the field and rule. */
  errors: ScreeningError[];
}

/**
 * Screens a batch of motors of one site against every retrofit option.
 *
 * @param motors the motors (each as `assess` takes it, parsed by motorSchema)
 * @param site the site (SiteInput): tariff [currency/kWh], demand charge [currency/(kW·month)], CO2
 *   [kg/kWh], voltage [V], frequency [Hz], default hours [h/a]
 * @param priceBook optional; missing parts from DEFAULT_PRICE_BOOK
 * @param assumptions optional overrides of the defaults in calc/assess/defaults.ts
 * @returns MotorScreening: per (motor, option) the figures of `assess` (OPTION_FIGURES: annualKwh
 *   [kWh/a], savingsKwh, savingsCost [currency/a], capex [currency], simple and discounted payback
 *   [a], npv [currency], irr [-], lifeCycleCost [currency], lineCurrentA [A], kva [kVA], …), rounded
 *   as `assess` rounds them; per motor the recommended slot, efficiency, power factor and hours.
 *   A motor that breaks a rule does not stop the batch: it is listed in `errors` with its index and
 *   field, and its figures are NaN.
 * @throws CalcInputError for a site, price-book or assumption error (it concerns every motor), with
 *   the field `assess` gives it.
 * Equations and sources: those of `assess` (calc/assess/engine.ts and the domain functions).
 */
export function screenMotors(motors: readonly MotorInput[], site: SiteInput, priceBook?: PriceBookInput, assumptions?: AssumptionsInput): MotorScreening {
  const context = assessmentContext(site, priceBook, assumptions, false, true);
  if (context.error !== null) throw context.error;
  const motorCount = motors.length;
  const figures = figureColumns(motorCount * OPTION_SLOTS);
  const recommendedSlot = new Int8Array(motorCount).fill(-1);
  const optionCount = new Uint8Array(motorCount);
  const efficiencyPct = new Float64Array(motorCount).fill(Number.NaN);
  const powerFactor = new Float64Array(motorCount).fill(Number.NaN);
  const annualHours = new Float64Array(motorCount).fill(Number.NaN);
  const errors: ScreeningError[] = [];
  const summary = motorSummary();
  for (let index = 0; index < motorCount; index += 1) {
    const error = screenOne(motors[index]!, context, figures, index * OPTION_SLOTS, summary);
    if (error !== null) {
      clearRows(figures, index * OPTION_SLOTS);
      errors.push(screeningError(index, error));
      continue;
    }
    recommendedSlot[index] = summary.recommendedSlot;
    optionCount[index] = summary.speedControl ? OPTION_SLOTS : OPTION_SLOTS / 2;
    efficiencyPct[index] = summary.efficiencyPct;
    powerFactor[index] = summary.powerFactor;
    annualHours[index] = summary.annualHours;
  }
  return { motorCount, optionCodes: OPTION_CODES, figures, recommendedSlot, optionCount, efficiencyPct, powerFactor, annualHours, errors };
}

/** One motor into the columns; its input error, or null. */
function screenOne(motor: MotorInput, context: AssessmentContext, figures: FigureColumns, firstRow: number, summary: MotorSummary): CalcInputError | null {
  try {
    assessMotorInto(motor, context, figures, firstRow, summary, null);
    return null;
  } catch (thrown) {
    if (thrown instanceof CalcInputError) return thrown;
    throw thrown;
  }
}

/** A motor's rows back to NaN (it failed part way). */
function clearRows(figures: FigureColumns, firstRow: number): void {
  for (let slot = 0; slot < OPTION_SLOTS; slot += 1) clearRow(figures, firstRow + slot);
}

/** The error of motor `motorIndex`: "motor.x" becomes "motors.<index>.x"; other fields are kept. */
function screeningError(motorIndex: number, error: CalcInputError): ScreeningError {
  const rule = error.message.slice(error.field.length + 3); // the message is `"field" rule`
  const field = error.field.startsWith('motor.') ? `motors.${motorIndex}.${error.field.slice('motor.'.length)}` : error.field;
  return { motorIndex, field, message: new CalcInputError(field, rule).message };
}
