// The Site form's working copy: what the inputs hold (blank numbers are null) and its conversion to
// and from the API's shapes. Kept apart from the page so it can be tested on its own.
import type { SiteCreate, SiteOutput } from 'shared/site';

export interface TouBandDraft {
  /** Stable key for the list (bands have no id). */
  key: number;
  name: string;
  pricePerKwh: number | null;
  shareOfHoursPct: number | null;
}

export interface SiteDraft {
  name: string;
  code: string;
  location: string;
  voltageV: number | null;
  frequencyHz: 50 | 60;
  tariff: 'flat' | 'time-of-use';
  energyPricePerKwh: number | null;
  timeOfUse: TouBandDraft[];
  demandChargePerKwMonth: number | null;
  currency: string;
  co2KgPerKwh: number | null;
  defaultHoursPerYear: number | null;
}

let bandKey = 0;
export function newBandKey(): number {
  bandKey += 1;
  return bandKey;
}

/** A new site starts on a 400 V, 50 Hz supply in euros; the rest is for the user to fill in. */
export function emptySiteDraft(): SiteDraft {
  return {
    name: '',
    code: '',
    location: '',
    voltageV: 400,
    frequencyHz: 50,
    tariff: 'flat',
    energyPricePerKwh: null,
    timeOfUse: [],
    demandChargePerKwMonth: 0,
    currency: 'EUR',
    co2KgPerKwh: null,
    defaultHoursPerYear: null,
  };
}

export function siteToDraft(site: SiteOutput): SiteDraft {
  return {
    name: site.name,
    code: site.code ?? '',
    location: site.location ?? '',
    voltageV: site.voltageV,
    frequencyHz: site.frequencyHz,
    tariff: site.timeOfUse.length > 0 ? 'time-of-use' : 'flat',
    energyPricePerKwh: site.energyPricePerKwh,
    timeOfUse: site.timeOfUse.map((band) => ({ key: newBandKey(), ...band })),
    demandChargePerKwMonth: site.demandChargePerKwMonth,
    currency: site.currency,
    co2KgPerKwh: site.co2KgPerKwh,
    defaultHoursPerYear: site.defaultHoursPerYear,
  };
}

/**
 * The hours-weighted average price of time-of-use bands [currency/kWh], rounded to 5 decimals;
 * null while a band lacks a price or share.
 */
export function weightedBandPrice(bands: readonly TouBandDraft[]): number | null {
  if (bands.length === 0) return null;
  let sum = 0;
  for (const band of bands) {
    if (band.pricePerKwh === null || band.shareOfHoursPct === null) return null;
    sum += (band.pricePerKwh * band.shareOfHoursPct) / 100;
  }
  return Math.round(sum * 1e5) / 1e5;
}

/**
 * What the form sends, before validation: blank numbers become undefined (so the schema says
 * "is required"), blank optional texts are left out, and a time-of-use tariff also carries its
 * hours-weighted average as the flat price (the API needs one for every site).
 */
export function draftToInput(draft: SiteDraft): Record<string, unknown> {
  const orUndefined = (value: number | null) => (value === null ? undefined : value);
  const timeOfUse =
    draft.tariff === 'time-of-use'
      ? draft.timeOfUse.map((band) => ({
          name: band.name,
          pricePerKwh: orUndefined(band.pricePerKwh),
          shareOfHoursPct: orUndefined(band.shareOfHoursPct),
        }))
      : [];
  const price = draft.tariff === 'time-of-use' ? (weightedBandPrice(draft.timeOfUse) ?? draft.energyPricePerKwh) : draft.energyPricePerKwh;
  const input: Record<string, unknown> = {
    name: draft.name,
    voltageV: orUndefined(draft.voltageV),
    frequencyHz: draft.frequencyHz,
    energyPricePerKwh: orUndefined(price),
    timeOfUse,
    demandChargePerKwMonth: orUndefined(draft.demandChargePerKwMonth),
    currency: draft.currency.trim().toUpperCase(),
    co2KgPerKwh: orUndefined(draft.co2KgPerKwh),
    defaultHoursPerYear: orUndefined(draft.defaultHoursPerYear),
  };
  if (draft.code.trim()) input.code = draft.code;
  if (draft.location.trim()) input.location = draft.location;
  return input;
}

/** Changes for an edit: every field (a PATCH of the whole form), blank texts sent as '' to clear them. */
export function draftToUpdate(draft: SiteDraft): Record<string, unknown> {
  return { ...draftToInput(draft), code: draft.code, location: draft.location };
}

export type { SiteCreate };
