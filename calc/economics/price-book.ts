/**
 * The price book: what each retrofit item costs by size band, installation, rebates.
 *
 * DEFAULT_PRICE_BOOK holds placeholder prices, currency-neutral (read in the site's currency), of the
 * order of 2020s list prices less usual discounts; they are Statorline's round numbers, common
 * practice, no source. Every organisation is expected to replace them with its own quotes.
 */
import { CalcInputError, requirePositive } from '../errors.js';

/** The items a retrofit can buy. 'bldc' is the permanent-magnet motor together with its drive. */
export type PriceItem = 'rewind' | 'ie3' | 'ie4' | 'ie5' | 'bldc' | 'vsd';
export const PRICE_ITEMS: readonly PriceItem[] = ['rewind', 'ie3', 'ie4', 'ie5', 'bldc', 'vsd'];

/** One size band: applies to motors rated up to and including `upToKw`. */
export interface PriceBand {
  upToKw: number;
  /** [currency/kW] */
  costPerKw: number;
  /** [currency] */
  fixedCost: number;
}

/** Labour and material to fit an item: fixed + per kW. */
export interface InstallationCost {
  fixedCost: number;
  costPerKw: number;
}

/** A rebate on an option's capex: a fraction of the gross capex, per kW, or fixed (all add up). */
export interface Rebate {
  fraction?: number | undefined;
  perKw?: number | undefined;
  fixed?: number | undefined;
}

export interface PriceBook {
  /** Currency of the prices; must equal the site's when given. */
  currency?: string | undefined;
  items: Record<PriceItem, PriceBand[]>;
  /** Installing a new motor (removal, alignment, wiring) [currency]. */
  motorInstallation: InstallationCost;
  /** Installing a drive (cabinet, cabling, control signal) [currency]. */
  driveInstallation: InstallationCost;
  /** Rebates by option code (e.g. 'ie4', 'bldc-vsd'). */
  rebates?: Record<string, Rebate> | undefined;
}

/** Placeholder prices (see the module comment): common practice, no source. */
export const DEFAULT_PRICE_BOOK: PriceBook = Object.freeze({
  items: {
    rewind: [
      { upToKw: 7.5, costPerKw: 40, fixedCost: 150 },
      { upToKw: 45, costPerKw: 25, fixedCost: 300 },
      { upToKw: 1000, costPerKw: 18, fixedCost: 800 },
    ],
    ie3: [
      { upToKw: 7.5, costPerKw: 70, fixedCost: 150 },
      { upToKw: 45, costPerKw: 50, fixedCost: 300 },
      { upToKw: 1000, costPerKw: 45, fixedCost: 600 },
    ],
    ie4: [
      { upToKw: 7.5, costPerKw: 90, fixedCost: 180 },
      { upToKw: 45, costPerKw: 62, fixedCost: 380 },
      { upToKw: 1000, costPerKw: 55, fixedCost: 800 },
    ],
    ie5: [
      { upToKw: 7.5, costPerKw: 120, fixedCost: 220 },
      { upToKw: 45, costPerKw: 80, fixedCost: 450 },
      { upToKw: 1000, costPerKw: 70, fixedCost: 1000 },
    ],
    bldc: [
      { upToKw: 7.5, costPerKw: 220, fixedCost: 400 },
      { upToKw: 45, costPerKw: 140, fixedCost: 800 },
      { upToKw: 1000, costPerKw: 110, fixedCost: 2000 },
    ],
    vsd: [
      { upToKw: 7.5, costPerKw: 110, fixedCost: 250 },
      { upToKw: 45, costPerKw: 70, fixedCost: 500 },
      { upToKw: 1000, costPerKw: 55, fixedCost: 1500 },
    ],
  },
  motorInstallation: { fixedCost: 200, costPerKw: 8 },
  driveInstallation: { fixedCost: 300, costPerKw: 5 },
  rebates: {},
});

/**
 * Price of one item for a motor of a given size.
 *
 * @param bands the item's size bands, ascending by upToKw
 * @param ratedPowerKw [kW]
 * @param field the field to name in an error
 * @returns fixedCost + costPerKw·P of the first band with upToKw ≥ P (the last band above it) [currency].
 */
export function itemCost(bands: readonly PriceBand[], ratedPowerKw: number, field = 'priceBook.items'): number {
  requirePositive('ratedPowerKw', ratedPowerKw);
  if (bands.length === 0) throw new CalcInputError(field, 'needs at least one size band');
  let band = bands[bands.length - 1]!;
  for (const candidate of bands) {
    if (ratedPowerKw <= candidate.upToKw) {
      band = candidate;
      break;
    }
  }
  return band.fixedCost + band.costPerKw * ratedPowerKw;
}

/** Installation: fixedCost + costPerKw·P [currency]. */
export function installationCost(cost: InstallationCost, ratedPowerKw: number): number {
  return cost.fixedCost + cost.costPerKw * ratedPowerKw;
}

/**
 * Rebate on one option.
 *
 * @param rebate the option's rebate (or undefined); @param grossCapex [currency]; @param ratedPowerKw [kW]
 * @returns min(fraction·gross + perKw·P + fixed, gross) [currency]: a rebate never makes capex negative.
 */
export function rebateAmount(rebate: Rebate | undefined, grossCapex: number, ratedPowerKw: number): number {
  if (!rebate) return 0;
  const amount = (rebate.fraction ?? 0) * grossCapex + (rebate.perKw ?? 0) * ratedPowerKw + (rebate.fixed ?? 0);
  return Math.min(amount, grossCapex);
}
