/**
 * Sensitivity of a business case to the energy price and the operating hours: each factor changed
 * alone by SENSITIVITY_STEPS_PCT, the recommended list held fixed (the decision being judged), and the
 * case's aggregate economics recomputed. The extreme steps are the bars of a tornado chart.
 *
 * Each motor's scaled saving is what calc's assess gives for the scaled input (`scaleEnergyPrice`,
 * `scaleOperatingHours`), obtained from the parts of its result that the factor scales linearly
 * (`scaledSavings`) instead of 8 more assessments per motor: re-running assess cost about 8× the case
 * itself (10,000 motors: seconds, against the 2 s goal). tests/api/cases.test.ts re-runs assess with
 * the scaled inputs and checks the two agree.
 */
import { MAX_HOURS_PER_YEAR } from '../../calc/assess/defaults.js';
import type { MotorInput, SiteInput } from '../../calc/assess/schema.js';
import { Decimal } from 'decimal.js';
import { roundMoney, sumMoney } from '../../calc/economics/money.js';
import { SENSITIVITY_FACTORS, SENSITIVITY_STEPS_PCT, type CaseSensitivity, type SensitivityFactor, type SensitivityPoint } from '../shared/case.js';
import { cashFlowsFromSums, economicsOfFlows, type AggregateEconomics, type LifeSavings } from './economics.js';

export const FACTOR_LABELS: Record<SensitivityFactor, string> = {
  energyPrice: 'Energy price',
  operatingHours: 'Operating hours',
};

/** The site with every energy price (flat and time-of-use) × factor; demand charges unchanged. */
export function scaleEnergyPrice(site: SiteInput, factor: number): SiteInput {
  const scaled: SiteInput = { ...site };
  if (site.energyPricePerKwh !== undefined) scaled.energyPricePerKwh = site.energyPricePerKwh * factor;
  if (site.timeOfUse) scaled.timeOfUse = site.timeOfUse.map((period) => ({ ...period, pricePerKwh: period.pricePerKwh * factor }));
  return scaled;
}

/**
 * The motor with its running hours × factor, at most a year (8760 h): a duty profile's bins are
 * scaled together (their load shape kept); otherwise hoursPerYear is set to the base hours × factor.
 */
export function scaleOperatingHours(motor: MotorInput, annualHours: number, factor: number): MotorInput {
  if (motor.dutyProfile && motor.dutyProfile.length > 0) {
    const total = motor.dutyProfile.reduce((sum, bin) => sum + bin.hours, 0);
    const effective = total > 0 ? Math.min(factor, MAX_HOURS_PER_YEAR / total) : factor;
    return { ...motor, dutyProfile: motor.dutyProfile.map((bin) => ({ fraction: bin.fraction, hours: bin.hours * effective })) };
  }
  return { ...motor, hoursPerYear: Math.min(MAX_HOURS_PER_YEAR, annualHours * factor) };
}

export function pointOf(changePct: number, economics: AggregateEconomics): SensitivityPoint {
  return {
    changePct,
    savingsCost: economics.firstYearSavings,
    simplePaybackYears: economics.simplePaybackYears,
    discountedPaybackYears: economics.discountedPaybackYears,
    npv: economics.npv,
    irr: economics.irr,
  };
}

/** What the sensitivity needs of one recommended motor: its option's figures against today's. */
export interface SensitivityLine {
  capex: number;
  lifeYears: number;
  /** Baseline − option energy cost [currency/yr] (energy price × kWh: scales with the price and the hours). */
  energyCostSaved: number;
  /** Baseline − option demand cost [currency/yr] (peak kW × charge: neither price nor hours change it). */
  demandCostSaved: number;
  /** Hours the base assessment used [h/yr] (calc's motor.annualHours), for the one-year cap. */
  annualHours: number;
}

/**
 * The first-year saving of a line with the energy price or the running hours × scale, as calc's
 * assess computes it: energy cost = Σ P_in·h_run × price, so it is linear in the price and in the
 * hours of every bin (scaled together, capped at a year); the demand cost depends on the peak input
 * power only. The API test re-runs assess with scaled inputs and finds these values to the cent.
 */
export function scaledSavings(line: SensitivityLine, factor: SensitivityFactor, scale: number): number {
  const effective = factor === 'energyPrice' ? scale : line.annualHours > 0 ? Math.min(scale, MAX_HOURS_PER_YEAR / line.annualHours) : scale;
  return roundMoney(line.energyCostSaved * effective + line.demandCostSaved);
}

/**
 * Runs the sensitivity.
 *
 * @param lines the recommended motors (capex [currency], life [yr], energy and demand cost saved [currency/yr], hours [h/yr])
 * @param rate discount rate [-]; @param escalation energy-price escalation [-]
 * @param base the case's own economics (0 % change)
 * @returns per factor the points at each step of SENSITIVITY_STEPS_PCT and the lowest and highest step.
 *
 * Per life L the first-year saving at scale f is Σ (f_i·E_i + D_i) = f·ΣE − Σ_capped (f − f_i)·E_i + ΣD,
 * f_i = min(f, 8760 h / hours_i): the sums over all lines are taken once in decimal.js; only motors
 * that the scaled hours would push past a year are summed per step.
 */
export function caseSensitivity(lines: readonly SensitivityLine[], rate: number, escalation: number, base: AggregateEconomics): CaseSensitivity {
  const byLife = new Map<number, SensitivityLine[]>();
  for (const line of lines) {
    let list = byLife.get(line.lifeYears);
    if (!list) byLife.set(line.lifeYears, (list = []));
    list.push(line);
  }
  const lives = [...byLife].map(([lifeYears, list]) => ({
    lifeYears,
    list,
    energy: new Decimal(sumMoney(list.map((line) => line.energyCostSaved))),
    demand: new Decimal(sumMoney(list.map((line) => line.demandCostSaved))),
  }));
  const capex = base.capex;
  const factors: CaseSensitivity['factors'] = [];
  for (const factor of SENSITIVITY_FACTORS) {
    const points = SENSITIVITY_STEPS_PCT.map((step) => {
      const scale = 1 + step / 100;
      const savings: LifeSavings[] = lives.map((life) => {
        let total = life.energy.times(scale).plus(life.demand);
        if (factor === 'operatingHours' && scale > 1) {
          const corrections: number[] = [];
          for (const line of life.list) {
            const cap = line.annualHours > 0 ? MAX_HOURS_PER_YEAR / line.annualHours : scale;
            if (cap < scale) corrections.push((scale - cap) * line.energyCostSaved);
          }
          if (corrections.length > 0) total = total.minus(sumMoney(corrections, 10));
        }
        return { lifeYears: life.lifeYears, savingsCost: total.toDecimalPlaces(2, Decimal.ROUND_HALF_UP).toNumber() };
      });
      return pointOf(step, economicsOfFlows(cashFlowsFromSums(capex, savings, escalation), rate));
    });
    factors.push({ factor, label: FACTOR_LABELS[factor], points, low: points[0]!, high: points[points.length - 1]! });
  }
  return { stepsPct: [...SENSITIVITY_STEPS_PCT], base: pointOf(0, base), factors };
}
