/**
 * Sensitivity of a business case to the energy price and the operating hours: each factor changed
 * alone by SENSITIVITY_STEPS_PCT, the recommended list held fixed (the decision being judged), every
 * recommended motor re-assessed by calc's `assess` with the scaled input, and the case's aggregate
 * economics recomputed. The extreme steps are the bars of a tornado chart.
 */
import { assess } from '../../calc/assess/assess.js';
import { MAX_HOURS_PER_YEAR } from '../../calc/assess/defaults.js';
import type { AssumptionsInput, MotorInput, PriceBookInput, SiteInput } from '../../calc/assess/schema.js';
import { SENSITIVITY_STEPS_PCT, type CaseSensitivity, type SensitivityFactor, type SensitivityPoint } from '../shared/case.js';
import { aggregateEconomics, type AggregateEconomics, type InvestmentLine } from './economics.js';

/** A recommended motor as the sensitivity re-runs it. */
export interface SensitivityEntry {
  motor: MotorInput;
  site: SiteInput;
  /** Index of the site in the case, to share one scaled site object among its motors. */
  siteIndex: number;
  optionCode: string;
  /** Hours the base assessment used [h/yr] (calc's motor.annualHours). */
  annualHours: number;
}

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

/**
 * Runs the sensitivity.
 *
 * @param entries the recommended motors with their inputs; @param priceBook, assumptions as assessed
 * @param rate discount rate [-]; @param escalation energy-price escalation [-]
 * @param base the case's own economics (0 % change)
 * @returns per factor the points at each step and the lowest and highest step.
 */
export function caseSensitivity(
  entries: readonly SensitivityEntry[],
  priceBook: PriceBookInput | undefined,
  assumptions: AssumptionsInput | undefined,
  rate: number,
  escalation: number,
  base: AggregateEconomics,
): CaseSensitivity {
  const factors: CaseSensitivity['factors'] = [];
  for (const factor of ['energyPrice', 'operatingHours'] as const) {
    const points: SensitivityPoint[] = [];
    for (const step of SENSITIVITY_STEPS_PCT) {
      const scale = 1 + step / 100;
      const scaledSites = new Map<number, SiteInput>();
      const lines: InvestmentLine[] = [];
      for (const entry of entries) {
        let site = entry.site;
        let motor = entry.motor;
        if (factor === 'energyPrice') {
          site = scaledSites.get(entry.siteIndex) ?? scaleEnergyPrice(entry.site, scale);
          scaledSites.set(entry.siteIndex, site);
        } else {
          motor = scaleOperatingHours(entry.motor, entry.annualHours, scale);
        }
        const result = assess(motor, site, priceBook, assumptions, { detail: 'totals' });
        const option = result.options.find((candidate) => candidate.code === entry.optionCode);
        if (option) lines.push({ capex: option.capex, savingsCost: option.savingsCost, lifeYears: option.lifeYears });
      }
      points.push(pointOf(step, aggregateEconomics(lines, rate, escalation)));
    }
    factors.push({ factor, label: FACTOR_LABELS[factor], points, low: points[0]!, high: points[points.length - 1]! });
  }
  return { stepsPct: [...SENSITIVITY_STEPS_PCT], base: pointOf(0, base), factors };
}
