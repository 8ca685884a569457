/**
 * Energy and demand cost from a site's tariff: a flat price or a time-of-use table, plus a demand
 * charge per kW of monthly peak. Standard utility tariff structure (energy charge + demand charge).
 */
import { CalcInputError, requireInRange, requireNonNegative } from '../errors.js';

/** One time-of-use period: its price and the share of the motor's running hours that fall in it. */
export interface TimeOfUsePeriod {
  period: string;
  /** Energy price in this period [currency/kWh]. */
  pricePerKwh: number;
  /** Share of running hours in this period [-]; shares are normalised to add up to 1. */
  hoursShare: number;
}

/** Months a demand charge is billed per year [-]. */
export const DEMAND_CHARGE_MONTHS_PER_YEAR = 12;

/**
 * Mean energy price a motor pays.
 *
 * @param energyPricePerKwh flat price [currency/kWh] (used when no time-of-use table is given)
 * @param timeOfUse periods with price and share of running hours
 * @returns flat price, or Σ share_k·price_k / Σ share_k [currency/kWh] (running hours spread over the
 *   periods in the given shares; a motor's duty profile carries no time of day).
 */
export function effectiveEnergyPrice(energyPricePerKwh: number | undefined, timeOfUse: readonly TimeOfUsePeriod[] | undefined): number {
  if (timeOfUse && timeOfUse.length > 0) {
    let weighted = 0;
    let shares = 0;
    timeOfUse.forEach((entry, index) => {
      requireNonNegative(`timeOfUse.${index}.pricePerKwh`, entry.pricePerKwh);
      requireInRange(`timeOfUse.${index}.hoursShare`, entry.hoursShare, 0, 1);
      weighted += entry.hoursShare * entry.pricePerKwh;
      shares += entry.hoursShare;
    });
    if (shares <= 0) throw new CalcInputError('timeOfUse', 'needs a period with a positive hoursShare');
    return weighted / shares;
  }
  if (energyPricePerKwh === undefined) throw new CalcInputError('energyPricePerKwh', 'is required unless timeOfUse is given');
  requireNonNegative('energyPricePerKwh', energyPricePerKwh);
  return energyPricePerKwh;
}

/**
 * Yearly demand charge of a load.
 *
 * @param peakKw the load's highest input power [kW] (assumed coincident with the site's monthly peak)
 * @param demandChargePerKwMonth [currency/(kW·month)]
 * @returns peak · charge · 12 [currency/a].
 */
export function annualDemandCost(peakKw: number, demandChargePerKwMonth: number): number {
  return peakKw * demandChargePerKwMonth * DEMAND_CHARGE_MONTHS_PER_YEAR;
}
