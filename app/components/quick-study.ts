// The Quick study's model, without Vue: the editable draft, its conversion to and from calc's
// `assess` input (exactly: a register motor's input comes back unchanged when nothing is edited),
// the live computation with calc's own `assess`, and the chart data derived from calc.
import type { PartLoadCurve } from 'calc/contracts';
import { assess, type AssessResult, type OptionResult } from 'calc/assess/assess';
import { DEFAULT_DISCOUNT_RATE_PCT, DEFAULT_ENERGY_ESCALATION_PCT } from 'calc/assess/defaults';
import { assessInputSchema, type AssessInput, type AssumptionsInput, type PriceBookInput } from 'calc/assess/schema';
import { savingsCashFlows, discountedPaybackYears } from 'calc/economics/cash-flows';
import { CalcInputError } from 'calc/errors';
import type { SiteOutput } from 'shared/site';

export type Poles = 2 | 4 | 6 | 8;
export type Application = 'fan' | 'pump' | 'compressor' | 'conveyor' | 'mixer' | 'other';
export type ControlMethod = 'direct-on-line' | 'throttle-valve' | 'outlet-damper' | 'inlet-vanes' | 'variable-speed-drive';
export type EfficiencyClass = 'IE1' | 'IE2' | 'IE3' | 'IE4' | 'IE5' | 'unknown';
export type DriveClass = 'IE0' | 'IE1' | 'IE2';

export const APPLICATION_OPTIONS: { value: Application; label: string }[] = [
  { value: 'fan', label: 'Fan' },
  { value: 'pump', label: 'Pump' },
  { value: 'compressor', label: 'Compressor' },
  { value: 'conveyor', label: 'Conveyor' },
  { value: 'mixer', label: 'Mixer' },
  { value: 'other', label: 'Other' },
];
export const CONTROL_OPTIONS: { value: ControlMethod; label: string }[] = [
  { value: 'direct-on-line', label: 'Direct on line (on/off)' },
  { value: 'throttle-valve', label: 'Throttling valve' },
  { value: 'outlet-damper', label: 'Outlet damper' },
  { value: 'inlet-vanes', label: 'Inlet vanes' },
  { value: 'variable-speed-drive', label: 'Variable-speed drive' },
];
export const CLASS_OPTIONS: { value: EfficiencyClass; label: string }[] = [
  { value: 'IE1', label: 'IE1' },
  { value: 'IE2', label: 'IE2' },
  { value: 'IE3', label: 'IE3' },
  { value: 'IE4', label: 'IE4' },
  { value: 'IE5', label: 'IE5' },
  { value: 'unknown', label: 'Unknown' },
];
export const POLE_OPTIONS: Poles[] = [2, 4, 6, 8];

export interface DutyBinDraft {
  /** Fraction of rated load (of design flow for a fan or pump) [-]. */
  fraction: number | null;
  hours: number | null;
}

export interface TouBandDraft {
  period: string;
  pricePerKwh: number | null;
  /** Share of running hours [-] (0–1). */
  hoursShare: number | null;
}

export interface MotorDraft {
  tag: string;
  description: string;
  area: string;
  frame: string;
  ratedPowerKw: number | null;
  poles: Poles | null;
  speedRpm: number | null;
  voltageV: number | null;
  frequencyHz: 50 | 60 | null;
  efficiencyMode: 'class' | 'nameplate';
  efficiencyClass: EfficiencyClass | null;
  nameplateEfficiencyPct: number | null;
  powerFactor: number | null;
  ratedCurrentA: number | null;
  rewinds: number | null;
  yearInstalled: number | null;
  application: Application | null;
  controlMethod: ControlMethod | null;
  staticHeadFraction: number | null;
  driveClass: DriveClass | null;
  loadMode: 'single' | 'profile';
  hoursPerYear: number | null;
  loadFactor: number | null;
  dutyProfile: DutyBinDraft[];
  /** A linked BLDC design's curve (from the register); carried, not edited here. */
  bldcCurve: PartLoadCurve | null;
}

export interface SiteDraft {
  /** The register site the tariff was taken from (null: typed by hand). */
  siteId: number | null;
  name: string;
  voltageV: number | null;
  frequencyHz: 50 | 60 | null;
  tariffMode: 'flat' | 'tou';
  energyPricePerKwh: number | null;
  timeOfUse: TouBandDraft[];
  demandChargePerKwMonth: number | null;
  currency: string;
  co2KgPerKwh: number | null;
  defaultHoursPerYear: number | null;
}

export interface StudyDraft {
  motor: MotorDraft;
  site: SiteDraft;
  /** The organisation's stored settings (or what a loaded study carried); passed to calc as given. */
  priceBook: PriceBookInput | null;
  assumptions: AssumptionsInput | null;
}

/** A blank study: a 4-pole 400 V 50 Hz motor with nothing assumed that calc would not default itself. */
export function blankDraft(): StudyDraft {
  return {
    motor: {
      tag: '',
      description: '',
      area: '',
      frame: '',
      ratedPowerKw: null,
      poles: 4,
      speedRpm: null,
      voltageV: null,
      frequencyHz: null,
      efficiencyMode: 'class',
      efficiencyClass: 'IE1',
      nameplateEfficiencyPct: null,
      powerFactor: null,
      ratedCurrentA: null,
      rewinds: 0,
      yearInstalled: null,
      application: 'fan',
      controlMethod: 'outlet-damper',
      staticHeadFraction: null,
      driveClass: null,
      loadMode: 'single',
      hoursPerYear: 6000,
      loadFactor: 0.75,
      dutyProfile: [
        { fraction: 1, hours: 1500 },
        { fraction: 0.8, hours: 3000 },
        { fraction: 0.6, hours: 1500 },
      ],
      bldcCurve: null,
    },
    site: {
      siteId: null,
      name: '',
      voltageV: 400,
      frequencyHz: 50,
      tariffMode: 'flat',
      energyPricePerKwh: 0.15,
      timeOfUse: [
        { period: 'Peak', pricePerKwh: 0.2, hoursShare: 0.4 },
        { period: 'Off-peak', pricePerKwh: 0.1, hoursShare: 0.6 },
      ],
      demandChargePerKwMonth: 0,
      currency: 'EUR',
      co2KgPerKwh: 0.4,
      defaultHoursPerYear: null,
    },
    priceBook: null,
    assumptions: null,
  };
}

const orNull = <T>(value: T | undefined): T | null => (value === undefined ? null : value);

/** The draft of a stored or built `assess` input (a register motor's, a saved study's). */
export function inputToDraft(input: AssessInput, siteId: number | null = null): StudyDraft {
  const { motor, site } = input;
  const blank = blankDraft();
  const profile = motor.dutyProfile ?? [];
  return {
    motor: {
      tag: motor.tag ?? '',
      description: motor.description ?? '',
      area: motor.area ?? '',
      frame: motor.frame ?? '',
      ratedPowerKw: motor.ratedPowerKw,
      poles: orNull(motor.poles),
      speedRpm: orNull(motor.speedRpm),
      voltageV: orNull(motor.voltageV),
      frequencyHz: orNull(motor.frequencyHz),
      efficiencyMode: motor.nameplateEfficiencyPct !== undefined ? 'nameplate' : 'class',
      efficiencyClass: orNull(motor.efficiencyClass),
      nameplateEfficiencyPct: orNull(motor.nameplateEfficiencyPct),
      powerFactor: orNull(motor.powerFactor),
      ratedCurrentA: orNull(motor.ratedCurrentA),
      rewinds: orNull(motor.rewinds),
      yearInstalled: orNull(motor.yearInstalled),
      application: orNull(motor.application),
      controlMethod: orNull(motor.controlMethod),
      staticHeadFraction: orNull(motor.staticHeadFraction),
      driveClass: orNull(motor.driveClass),
      loadMode: profile.length > 0 ? 'profile' : 'single',
      hoursPerYear: orNull(motor.hoursPerYear),
      loadFactor: orNull(motor.loadFactor),
      dutyProfile: profile.length > 0 ? profile.map((bin) => ({ ...bin })) : blank.motor.dutyProfile,
      bldcCurve: orNull(motor.bldcCurve),
    },
    site: {
      siteId,
      name: site.name ?? '',
      voltageV: orNull(site.voltageV),
      frequencyHz: orNull(site.frequencyHz),
      tariffMode: site.timeOfUse && site.timeOfUse.length > 0 ? 'tou' : 'flat',
      energyPricePerKwh: orNull(site.energyPricePerKwh),
      timeOfUse: site.timeOfUse && site.timeOfUse.length > 0 ? site.timeOfUse.map((band) => ({ ...band })) : blank.site.timeOfUse,
      demandChargePerKwMonth: orNull(site.demandChargePerKwMonth),
      currency: site.currency ?? '',
      co2KgPerKwh: orNull(site.co2KgPerKwh),
      defaultHoursPerYear: orNull(site.defaultHoursPerYear),
    },
    priceBook: input.priceBook ?? null,
    assumptions: input.assumptions ?? null,
  };
}

/** The tariff and supply of a register site, as the server builds it (server/studies/motor-input.ts siteInput). */
export function siteToDraft(site: SiteOutput): SiteDraft {
  const bands = site.timeOfUse.filter((band) => band.shareOfHoursPct > 0);
  return {
    siteId: site.id,
    name: site.name,
    voltageV: site.voltageV,
    frequencyHz: site.frequencyHz,
    tariffMode: bands.length > 0 ? 'tou' : 'flat',
    energyPricePerKwh: site.energyPricePerKwh,
    timeOfUse:
      bands.length > 0
        ? bands.map((band) => ({ period: band.name, pricePerKwh: band.pricePerKwh, hoursShare: band.shareOfHoursPct / 100 }))
        : blankDraft().site.timeOfUse,
    demandChargePerKwMonth: site.demandChargePerKwMonth,
    currency: site.currency,
    co2KgPerKwh: site.co2KgPerKwh,
    defaultHoursPerYear: site.defaultHoursPerYear,
  };
}

/** Copies the entries whose value is given (not null, not ''), so calc defaults the rest and says so. */
function given(entries: Record<string, unknown>): Record<string, unknown> {
  const out: Record<string, unknown> = {};
  for (const [key, value] of Object.entries(entries)) {
    if (value !== null && value !== undefined && value !== '') out[key] = value;
  }
  return out;
}

/** The `assess` input of a draft, not yet validated (assessInputSchema does that). */
export function draftToInput(draft: StudyDraft): unknown {
  const m = draft.motor;
  const s = draft.site;
  const motor = given({
    tag: m.tag.trim(),
    description: m.description.trim(),
    area: m.area.trim(),
    application: m.application,
    ratedPowerKw: m.ratedPowerKw,
    speedRpm: m.speedRpm,
    poles: m.poles,
    voltageV: m.voltageV,
    frequencyHz: m.frequencyHz,
    ratedCurrentA: m.ratedCurrentA,
    efficiencyClass: m.efficiencyClass,
    nameplateEfficiencyPct: m.efficiencyMode === 'nameplate' ? m.nameplateEfficiencyPct : null,
    powerFactor: m.powerFactor,
    frame: m.frame.trim(),
    controlMethod: m.controlMethod,
    hoursPerYear: m.hoursPerYear,
    loadFactor: m.loadFactor,
    dutyProfile: m.loadMode === 'profile' ? m.dutyProfile.map((bin) => ({ fraction: bin.fraction, hours: bin.hours })) : null,
    rewinds: m.rewinds,
    yearInstalled: m.yearInstalled,
    staticHeadFraction: m.application === 'pump' ? m.staticHeadFraction : null,
    driveClass: m.controlMethod === 'variable-speed-drive' ? m.driveClass : null,
    bldcCurve: m.bldcCurve,
  });
  // A missing required number stays visible to the schema ("is required") rather than vanishing.
  if (m.ratedPowerKw === null) motor.ratedPowerKw = undefined;
  const site = given({
    name: s.name.trim(),
    voltageV: s.voltageV,
    frequencyHz: s.frequencyHz,
    energyPricePerKwh: s.energyPricePerKwh,
    timeOfUse: s.tariffMode === 'tou' ? s.timeOfUse.map((band) => ({ period: band.period, pricePerKwh: band.pricePerKwh, hoursShare: band.hoursShare })) : null,
    demandChargePerKwMonth: s.demandChargePerKwMonth,
    currency: s.currency.trim().toUpperCase(),
    co2KgPerKwh: s.co2KgPerKwh,
    defaultHoursPerYear: s.defaultHoursPerYear,
  });
  const input: Record<string, unknown> = { motor, site };
  if (draft.priceBook) input.priceBook = draft.priceBook;
  if (draft.assumptions) input.assumptions = draft.assumptions;
  return input;
}

export interface LiveOutcome {
  input: AssessInput | null;
  result: AssessResult | null;
  /** Messages by dotted field (`motor.ratedPowerKw`), from the schema or from calc. */
  errors: Record<string, string>;
}

/** Validates the draft with the shared schema and runs calc's `assess`, exactly as the server does. */
export function computeLive(draft: StudyDraft): LiveOutcome {
  const parsed = assessInputSchema.safeParse(draftToInput(draft));
  if (!parsed.success) {
    const errors: Record<string, string> = {};
    for (const issue of parsed.error.issues) {
      const key = issue.path.map(String).join('.');
      if (!(key in errors)) errors[key] = issue.code === 'invalid_type' && issue.input === undefined ? 'is required' : issue.message;
    }
    return { input: null, result: null, errors };
  }
  const input = parsed.data;
  try {
    return { input, result: assess(input.motor, input.site, input.priceBook, input.assumptions), errors: {} };
  } catch (error) {
    if (error instanceof CalcInputError) {
      const rule = error.message.slice(error.field.length + 3);
      return { input, result: null, errors: { [error.field]: rule } };
    }
    throw error;
  }
}

/** Shaft-load points of the part-load charts [-]: 10 % to 125 % in 5 % steps (24 points). */
export const CURVE_LOADS: readonly number[] = Array.from({ length: 24 }, (_, index) => Math.round((0.1 + index * 0.05) * 100) / 100);

export interface CurveSeries {
  code: string;
  label: string;
  /** [load %, value] pairs. */
  efficiency: [number, number][];
  inputKw: [number, number][];
}

/**
 * Efficiency and input power versus shaft load of every motor option, computed by calc's `assess`
 * itself: the same motor as a constant-speed load with one 1-hour bin per load point, so each
 * option's bins are its own part-load model (loss split, drive, BLDC curve) at that load. The
 * speed-control variants use the same machines; their savings come from the flow, not the curve.
 */
export function partLoadCurves(input: AssessInput): CurveSeries[] {
  const sweepMotor = {
    ...input.motor,
    application: 'other' as const,
    controlMethod: input.motor.controlMethod === 'variable-speed-drive' ? ('variable-speed-drive' as const) : ('direct-on-line' as const),
    dutyProfile: CURVE_LOADS.map((fraction) => ({ fraction, hours: 1 })),
  };
  const result = assess(sweepMotor, input.site, input.priceBook, input.assumptions);
  return result.options.map((option) => ({
    code: option.code,
    label: option.label,
    efficiency: option.bins.map((bin) => [Math.round(bin.fraction * 100), Math.round(bin.efficiency * 10000) / 100] as [number, number]),
    inputKw: option.bins.map((bin) => [Math.round(bin.fraction * 100), Math.round(bin.inputKw * 1000) / 1000] as [number, number]),
  }));
}

export interface CashFlowSeries {
  code: string;
  label: string;
  /** [year, cumulative discounted cash flow] pairs, year 0 to the option's life. */
  points: [number, number][];
  /** Discounted payback [a] (on the line at zero), null when it does not pay back within its life. */
  paybackYears: number | null;
}

/**
 * Cumulative discounted cash flow of an option over its life: −capex, then the escalating savings
 * discounted (calc's savingsCashFlows), so the line ends at the option's NPV and crosses zero at its
 * discounted payback.
 */
export function cumulativeCashFlow(option: OptionResult, assumptions: AssumptionsInput | undefined): CashFlowSeries {
  const rate = (assumptions?.discountRatePct ?? DEFAULT_DISCOUNT_RATE_PCT) / 100;
  const escalation = (assumptions?.energyEscalationPct ?? DEFAULT_ENERGY_ESCALATION_PCT) / 100;
  const flows = savingsCashFlows(Math.max(option.capex, 0), option.savingsCost, option.lifeYears, escalation);
  const points: [number, number][] = [];
  let cumulative = 0;
  let discount = 1;
  flows.forEach((flow, year) => {
    if (year > 0) discount /= 1 + rate;
    cumulative += flow * discount;
    points.push([year, Math.round(cumulative)]);
  });
  return { code: option.code, label: option.label, points, paybackYears: discountedPaybackYears(rate, flows) };
}

/** Options worth charting by default: the recommendation and the next best by NPV, at most three. */
export function defaultCashFlowCodes(result: AssessResult): string[] {
  const ranked = result.options.filter((option) => option.code !== 'keep').sort((a, b) => b.npv - a.npv);
  const codes = ranked.slice(0, 3).map((option) => option.code);
  if (result.recommended.code !== 'keep' && !codes.includes(result.recommended.code)) codes.unshift(result.recommended.code);
  return codes.slice(0, 3);
}

/** True when a result includes a permanent-magnet option (the handling caution applies). */
export function hasBldcOption(result: AssessResult | null): boolean {
  return !!result?.options.some((option) => option.code.startsWith('bldc'));
}
