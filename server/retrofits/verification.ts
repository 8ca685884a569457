/**
 * Verified savings of one retrofit from its baseline and reporting meter data, in the manner of
 * IPMVP (EVO, International Performance Measurement and Verification Protocol, Core Concepts 2022,
 * "Retrofit isolation" options):
 *
 * Option B — all parameters measured. The energy of both periods is metered; the baseline is
 * adjusted to the reporting period's conditions through an independent variable X: the operating
 * hours counted from the metered power (intervals whose mean power is above RUNNING_THRESHOLD of the
 * motor's rated power), or a column of the meter files that the user names (production, flow…).
 *   - regression, when the baseline has at least MIN_REGRESSION_DAYS complete days, X varies, and
 *     R² ≥ MIN_R2: daily E = a + b·X by ordinary least squares;
 *     adjusted baseline = a·(reporting covered hours / 24) + b·X_reporting.
 *   - ratio otherwise: adjusted baseline = (E_baseline / X_baseline) · X_reporting.
 *   Savings = adjusted baseline − reporting energy ("avoided energy", IPMVP). Annualised: with
 *   operating hours, × hoursPerYear / reporting operating hours (normalised to the register's hours);
 *   with another variable, × 8760 h / reporting covered hours.
 * Option A — key parameter measured. The mean running power is metered in both periods; the
 *   operating hours are stipulated (the retrofit's stipulatedHoursPerYear, else the motor register's
 *   hoursPerYear): annual savings = (P̄_baseline − P̄_reporting) · H_stipulated; over the reporting
 *   period the stipulated hours are pro-rated to its covered hours.
 *
 * Uncertainty at CONFIDENCE_PCT (two-sided), measurement and model error only:
 *   - regression: the fractional savings uncertainty of ASHRAE Guideline 14-2014, Annex B (after
 *     Reddy & Claridge, 2000): ΔS = t · 1.26 · CV(RMSE) · E_adjusted · √((1 + 2/n) / m), with n
 *     baseline days, m reporting days, t at n − 2 degrees of freedom (autocorrelation neglected, n' = n).
 *   - operating-hours ratio and option A: the standard errors of the two mean running powers,
 *     ΔP = t · √(SE_b² + SE_r²) at n_b + n_r − 2 degrees of freedom, times the hours the savings are
 *     scaled by. Successive intervals are autocorrelated, which this neglects, so it is a lower bound.
 *   - ratio on another variable: the standard error of the baseline's daily intensity E/X, times X_reporting.
 *   A stipulated value (option A's hours) carries no measured uncertainty (IPMVP); it is not included.
 */
import type { MeterPoint, MeterScope, PeriodStatistics, VerificationOutput } from '../shared/retrofit.js';
import { wallIso } from './meter-csv.js';

/** An interval is "running" when its mean power exceeds this fraction of the motor's rated power [-]. Common practice, no source. */
export const RUNNING_THRESHOLD = 0.05;
/** Regression needs at least this many complete baseline days (ASHRAE Guideline 14 asks for a full range of conditions; common practice). */
export const MIN_REGRESSION_DAYS = 6;
/** Regression is used only when it explains the baseline this well (IPMVP: R² ≥ 0.75 is "often considered reasonable"). */
export const MIN_R2 = 0.75;
/** A day counts as complete with at least this share of its 24 h metered [-]. */
export const COMPLETE_DAY_SHARE = 0.9;
export const CONFIDENCE_PCT = 90;
const HOURS_PER_YEAR = 8760;
const DAY_MS = 86_400_000;

/**
 * Student's t, two-sided 90 % (one-sided 0.95 quantile), by degrees of freedom; values from memory
 * of the standard table, checked against any statistics handbook's t table.
 */
const T90: ReadonlyArray<[number, number]> = [
  [1, 6.314], [2, 2.92], [3, 2.353], [4, 2.132], [5, 2.015], [6, 1.943], [7, 1.895], [8, 1.86], [9, 1.833], [10, 1.812],
  [11, 1.796], [12, 1.782], [13, 1.771], [14, 1.761], [15, 1.753], [16, 1.746], [17, 1.74], [18, 1.734], [19, 1.729], [20, 1.725],
  [25, 1.708], [30, 1.697], [40, 1.684], [60, 1.671], [120, 1.658],
];

/** Two-sided 90 % Student's t for `degreesOfFreedom` (linear in 1/df between table rows; 1.645 beyond 120). */
export function studentT90(degreesOfFreedom: number): number {
  if (degreesOfFreedom <= 1) return T90[0]![1];
  if (degreesOfFreedom > 120) return 1.645;
  for (let index = 1; index < T90.length; index += 1) {
    const [df1, t1] = T90[index - 1]!;
    const [df2, t2] = T90[index]!;
    if (degreesOfFreedom <= df2) {
      const share = (1 / df1 - 1 / degreesOfFreedom) / (1 / df1 - 1 / df2);
      return t1 + (t2 - t1) * share;
    }
  }
  return 1.645;
}

export interface PeriodData {
  points: MeterPoint[];
  scope: MeterScope;
  variableName: string | null;
  gaps: number;
}

interface PeriodFigures extends PeriodStatistics {
  runningPowers: number[];
  days: Array<{ kwh: number; x: number; hours: number }>;
}

/** Energy, covered and operating hours, mean running power and daily totals of one period. */
export function periodFigures(period: PeriodData, thresholdKw: number, variable: 'hours' | 'column'): PeriodFigures {
  let kwh = 0;
  let coveredHours = 0;
  let operatingHours = 0;
  let runningKwh = 0;
  let variableTotal: number | null = period.variableName === null ? null : 0;
  const runningPowers: number[] = [];
  const dayMap = new Map<number, { kwh: number; x: number; hours: number }>();
  for (const [start, hours, energy, value] of period.points) {
    kwh += energy;
    coveredHours += hours;
    const power = hours > 0 ? energy / hours : 0;
    const running = power > thresholdKw;
    if (running) {
      operatingHours += hours;
      runningKwh += energy;
      runningPowers.push(power);
    }
    if (variableTotal !== null) variableTotal = value === null ? null : variableTotal + value;
    const day = Math.floor(start / DAY_MS);
    const entry = dayMap.get(day) ?? { kwh: 0, x: 0, hours: 0 };
    entry.kwh += energy;
    entry.hours += hours;
    entry.x += variable === 'hours' ? (running ? hours : 0) : (value ?? 0);
    dayMap.set(day, entry);
  }
  const first = period.points[0];
  const last = period.points[period.points.length - 1];
  return {
    start: first ? wallIso(first[0]) : '',
    end: last ? wallIso(last[0] + last[1] * 3_600_000) : '',
    kwh,
    coveredHours,
    operatingHours,
    meanRunningKw: operatingHours > 0 ? runningKwh / operatingHours : null,
    variableTotal,
    scope: period.scope,
    gaps: period.gaps,
    runningPowers,
    days: [...dayMap.values()].filter((day) => day.hours >= 24 * COMPLETE_DAY_SHARE),
  };
}

const mean = (values: number[]) => values.reduce((sum, value) => sum + value, 0) / values.length;
/** Standard error of the mean (sample standard deviation / √n). */
function standardError(values: number[]): number | null {
  if (values.length < 2) return null;
  const average = mean(values);
  const variance = values.reduce((sum, value) => sum + (value - average) ** 2, 0) / (values.length - 1);
  return Math.sqrt(variance / values.length);
}

/** Ordinary least squares y = a + b·x with R² and CV(RMSE) (n − 2 degrees of freedom, ASHRAE Guideline 14). */
export function linearRegression(xs: number[], ys: number[]): { intercept: number; slope: number; r2: number; cvRmse: number } | null {
  const n = xs.length;
  if (n < 3) return null;
  const xMean = mean(xs);
  const yMean = mean(ys);
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (let index = 0; index < n; index += 1) {
    sxx += (xs[index]! - xMean) ** 2;
    sxy += (xs[index]! - xMean) * (ys[index]! - yMean);
    syy += (ys[index]! - yMean) ** 2;
  }
  if (sxx === 0 || yMean === 0) return null;
  const slope = sxy / sxx;
  const intercept = yMean - slope * xMean;
  let sse = 0;
  for (let index = 0; index < n; index += 1) sse += (ys[index]! - intercept - slope * xs[index]!) ** 2;
  const r2 = syy === 0 ? 1 : 1 - sse / syy;
  const cvRmse = Math.sqrt(sse / (n - 2)) / yMean;
  return { intercept, slope, r2, cvRmse };
}

export interface VerificationInputs {
  retrofitId: number;
  method: 'A' | 'B';
  /** A column of the meter files; null: operating hours. */
  independentVariable: string | null;
  ratedPowerKw: number;
  /** Stipulated (A) or normal-year (B with operating hours) operating hours [h/yr]; null when unknown. */
  hoursPerYear: number | null;
  predictedSavingsKwh: number;
  baseline: PeriodData | null;
  reporting: PeriodData | null;
}

const round = (value: number, digits = 3) => Math.round(value * 10 ** digits) / 10 ** digits;
const publicStatistics = (figures: PeriodFigures): PeriodStatistics => ({
  start: figures.start,
  end: figures.end,
  kwh: round(figures.kwh),
  coveredHours: round(figures.coveredHours),
  operatingHours: round(figures.operatingHours),
  meanRunningKw: figures.meanRunningKw === null ? null : round(figures.meanRunningKw, 4),
  variableTotal: figures.variableTotal === null ? null : round(figures.variableTotal, 4),
  scope: figures.scope,
  gaps: figures.gaps,
});

/** The verification of one retrofit (see the module comment for the methods and their sources). */
export function verifySavings(inputs: VerificationInputs): VerificationOutput {
  const thresholdKw = RUNNING_THRESHOLD * inputs.ratedPowerKw;
  const usesColumn = inputs.method === 'B' && inputs.independentVariable !== null;
  const output: VerificationOutput = {
    retrofitId: inputs.retrofitId,
    ready: false,
    missing: [],
    method: inputs.method,
    model: null,
    description: null,
    formula: null,
    independentVariable: inputs.method === 'A' ? 'operating hours (stipulated)' : (inputs.independentVariable ?? 'operating hours'),
    thresholdKw: round(thresholdKw, 4),
    hoursPerYear: inputs.hoursPerYear,
    baseline: null,
    reporting: null,
    baselineKwh: null,
    reportingKwh: null,
    adjustedBaselineKwh: null,
    reportingComparedKwh: null,
    verifiedSavingsKwh: null,
    annualSavingsKwh: null,
    predictedSavingsKwh: inputs.predictedSavingsKwh,
    realisedPct: null,
    regression: null,
    uncertaintyKwh: null,
    uncertaintyPeriodKwh: null,
    confidencePct: CONFIDENCE_PCT,
    uncertaintyMethod: null,
    notes: [],
  };
  if (!inputs.baseline) output.missing.push('baseline meter data');
  if (!inputs.reporting) output.missing.push('reporting meter data');
  if (inputs.method === 'A' && inputs.hoursPerYear === null) output.missing.push('stipulated operating hours (set them, or the motor’s hoursPerYear)');
  const variable = usesColumn ? 'column' : 'hours';
  const baseline = inputs.baseline ? periodFigures(inputs.baseline, thresholdKw, variable) : null;
  const reporting = inputs.reporting ? periodFigures(inputs.reporting, thresholdKw, variable) : null;
  if (baseline) output.baseline = publicStatistics(baseline);
  if (reporting) output.reporting = publicStatistics(reporting);
  if (usesColumn) {
    const wanted = inputs.independentVariable!.toLowerCase();
    for (const [name, period] of [['baseline', inputs.baseline], ['reporting', inputs.reporting]] as const) {
      if (period && period.variableName?.toLowerCase() !== wanted) output.missing.push(`a column "${inputs.independentVariable!}" in the ${name} file`);
    }
  }
  if (baseline && reporting) {
    if (baseline.scope !== reporting.scope) output.notes.push('The two periods were metered at different scopes (motor and feeder); the savings mix the motor with the feeder’s other loads.');
    else if (baseline.scope === 'feeder') output.notes.push('Metered on a feeder: the savings include any change of the feeder’s other loads (IPMVP: interactive effects).');
    if (baseline.gaps + reporting.gaps > 0) output.notes.push(`Gaps in the data (${baseline.gaps} baseline, ${reporting.gaps} reporting) are left out, not filled.`);
  }
  if (output.missing.length > 0 || !baseline || !reporting) return output;
  output.baselineKwh = round(baseline.kwh);
  output.reportingKwh = round(reporting.kwh);

  let adjusted: number;
  let compared: number;
  let annualFactor: number;
  let uncertaintyPeriod: number | null = null;
  if (inputs.method === 'A') {
    if (baseline.meanRunningKw === null || reporting.meanRunningKw === null) {
      output.missing.push(`intervals with the motor running (mean power above ${round(thresholdKw, 3)} kW) in ${baseline.meanRunningKw === null ? 'the baseline' : 'the reporting period'}`);
      return output;
    }
    const hoursYear = inputs.hoursPerYear!;
    const hoursPeriod = (hoursYear * reporting.coveredHours) / HOURS_PER_YEAR;
    adjusted = baseline.meanRunningKw * hoursPeriod;
    compared = reporting.meanRunningKw * hoursPeriod;
    annualFactor = HOURS_PER_YEAR / reporting.coveredHours;
    output.model = 'stipulated-hours';
    output.description = 'IPMVP option A, retrofit isolation with key parameter measurement: the mean running power is metered before and after; the operating hours are stipulated.';
    output.formula = 'annual savings = (P̄run,baseline − P̄run,reporting) × H_stipulated; over the reporting period H = H_stipulated × covered hours / 8760';
    const seB = standardError(baseline.runningPowers);
    const seR = standardError(reporting.runningPowers);
    if (seB !== null && seR !== null) {
      const t = studentT90(baseline.runningPowers.length + reporting.runningPowers.length - 2);
      uncertaintyPeriod = t * Math.hypot(seB, seR) * hoursPeriod;
      output.uncertaintyMethod = 'standard errors of the two mean running powers, Student t at 90 % (autocorrelation neglected: a lower bound); the stipulated hours carry no measured uncertainty';
    }
  } else {
    const xBaseline = usesColumn ? baseline.variableTotal : baseline.operatingHours;
    const xReporting = usesColumn ? reporting.variableTotal : reporting.operatingHours;
    if (xBaseline === null || xReporting === null || xBaseline <= 0) {
      output.missing.push(usesColumn ? `values of "${inputs.independentVariable!}" in the baseline` : `intervals with the motor running (mean power above ${round(thresholdKw, 3)} kW) in the baseline`);
      return output;
    }
    const fit =
      baseline.days.length >= MIN_REGRESSION_DAYS ? linearRegression(baseline.days.map((day) => day.x), baseline.days.map((day) => day.kwh)) : null;
    const xName = usesColumn ? inputs.independentVariable! : 'operating hours';
    if (fit && fit.r2 >= MIN_R2 && fit.slope > 0) {
      adjusted = fit.intercept * (reporting.coveredHours / 24) + fit.slope * xReporting;
      output.model = 'regression';
      output.regression = { intercept: round(fit.intercept, 4), slope: round(fit.slope, 6), r2: round(fit.r2, 4), cvRmsePct: round(fit.cvRmse * 100, 3), days: baseline.days.length };
      output.formula = `adjusted baseline = a × (reporting covered hours / 24) + b × X_reporting, from daily E = a + b × X on the baseline (X = ${xName})`;
      const n = baseline.days.length;
      const m = reporting.coveredHours / 24;
      uncertaintyPeriod = studentT90(n - 2) * 1.26 * fit.cvRmse * adjusted * Math.sqrt((1 + 2 / n) / m);
      output.uncertaintyMethod = 'ASHRAE Guideline 14-2014 Annex B fractional savings uncertainty: t × 1.26 × CV(RMSE) × E_adjusted × √((1 + 2/n)/m), 90 %, autocorrelation neglected';
    } else {
      adjusted = (baseline.kwh / xBaseline) * xReporting;
      output.model = 'ratio';
      output.formula = `adjusted baseline = (E_baseline / X_baseline) × X_reporting (X = ${xName})`;
      if (fit) output.notes.push(`The daily regression on ${xName} was not used (R² ${round(fit.r2, 3)}, slope ${round(fit.slope, 4)}); the ratio was.`);
      if (usesColumn) {
        const intensities = baseline.days.filter((day) => day.x > 0).map((day) => day.kwh / day.x);
        const se = standardError(intensities);
        if (se !== null) {
          uncertaintyPeriod = studentT90(intensities.length - 1) * se * xReporting;
          output.uncertaintyMethod = 'standard error of the baseline’s daily energy intensity (kWh per unit of the variable), Student t at 90 %';
        }
      } else {
        const seB = standardError(baseline.runningPowers);
        const seR = standardError(reporting.runningPowers);
        if (seB !== null && seR !== null) {
          uncertaintyPeriod = studentT90(baseline.runningPowers.length + reporting.runningPowers.length - 2) * Math.hypot(seB, seR) * reporting.operatingHours;
          output.uncertaintyMethod = 'standard errors of the two mean running powers, Student t at 90 % (autocorrelation neglected: a lower bound)';
        }
      }
    }
    compared = reporting.kwh;
    output.description = `IPMVP option B, retrofit isolation with all parameters measured: the energy of both periods is metered and the baseline adjusted to the reporting period's ${xName}.`;
    if (!usesColumn && inputs.hoursPerYear !== null && reporting.operatingHours > 0) {
      annualFactor = inputs.hoursPerYear / reporting.operatingHours;
      output.formula += `; annual = savings × hoursPerYear (${inputs.hoursPerYear} h) / reporting operating hours`;
    } else {
      annualFactor = HOURS_PER_YEAR / reporting.coveredHours;
      output.formula += '; annual = savings × 8760 h / reporting covered hours';
    }
  }
  const savings = adjusted - compared;
  output.ready = true;
  output.adjustedBaselineKwh = round(adjusted);
  output.reportingComparedKwh = round(compared);
  output.verifiedSavingsKwh = round(savings);
  output.annualSavingsKwh = round(savings * annualFactor, 1);
  output.realisedPct = inputs.predictedSavingsKwh > 0 ? round(((savings * annualFactor) / inputs.predictedSavingsKwh) * 100, 2) : null;
  if (uncertaintyPeriod !== null) {
    output.uncertaintyPeriodKwh = round(uncertaintyPeriod);
    output.uncertaintyKwh = round(uncertaintyPeriod * annualFactor, 1);
  } else output.notes.push('Too few intervals to estimate the measurement uncertainty.');
  return output;
}
