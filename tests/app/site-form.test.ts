import { describe, expect, it } from 'vitest';
import { siteCreateBody } from 'shared/site';
import { draftToInput, draftToUpdate, emptySiteDraft, weightedBandPrice, type SiteDraft } from 'components/site-form';
import { useZodForm } from 'composables/useZodForm';
import { ApiError } from 'src/api/client';

const labels = {
  name: 'Name',
  voltageV: 'Line voltage',
  timeOfUse: 'Time-of-use bands:',
  'timeOfUse.name': 'Band name',
  currency: 'Currency',
  defaultHoursPerYear: 'Running hours',
  co2KgPerKwh: 'Emission factor',
  energyPricePerKwh: 'Energy price',
};

function filled(): SiteDraft {
  return {
    ...emptySiteDraft(),
    name: 'Dairy plant',
    energyPricePerKwh: 0.18,
    co2KgPerKwh: 0.35,
    defaultHoursPerYear: 6000,
  };
}

describe('site form', () => {
  it('asks for the blank required fields with their labels', () => {
    const form = useZodForm(siteCreateBody, labels);
    expect(form.validate(draftToInput({ ...emptySiteDraft(), voltageV: null }))).toBeNull();
    expect(form.error('name')).toBe('Name is required');
    expect(form.error('voltageV')).toBe('Line voltage is required');
    expect(form.error('defaultHoursPerYear')).toBe('Running hours is required');
  });

  it('shows the schema’s own limits', () => {
    const form = useZodForm(siteCreateBody, labels);
    form.validate(draftToInput({ ...filled(), voltageV: 50, currency: 'euro', defaultHoursPerYear: 9000 }));
    expect(form.error('voltageV')).toBe('Line voltage must be at least 100 V');
    expect(form.error('currency')).toBe('Currency must be a three-letter ISO 4217 code such as EUR');
    expect(form.error('defaultHoursPerYear')).toBe('Running hours must be at most 8760 h (one year)');
  });

  it('accepts a complete flat-tariff site and leaves blank texts out of a new one', () => {
    const form = useZodForm(siteCreateBody, labels);
    const input = form.validate(draftToInput(filled()));
    expect(input).toMatchObject({ name: 'Dairy plant', voltageV: 400, frequencyHz: 50, currency: 'EUR', timeOfUse: [] });
    expect(input).not.toHaveProperty('code');
  });

  it('checks that time-of-use shares add up to 100 % and names a band without a name', () => {
    const form = useZodForm(siteCreateBody, labels);
    const draft: SiteDraft = {
      ...filled(),
      tariff: 'time-of-use',
      timeOfUse: [
        { key: 1, name: 'Peak', pricePerKwh: 0.3, shareOfHoursPct: 40 },
        { key: 2, name: '', pricePerKwh: 0.1, shareOfHoursPct: 40 },
      ],
    };
    expect(form.validate(draftToInput(draft))).toBeNull();
    expect(form.error('timeOfUse')).toBe('Time-of-use bands: shares of hours must add up to 100 %');
    expect(form.error('timeOfUse.1.name')).toBe('Band name is required');
  });

  it('prices a time-of-use tariff at the hours-weighted average of its bands', () => {
    const bands = [
      { key: 1, name: 'Peak', pricePerKwh: 0.3, shareOfHoursPct: 25 },
      { key: 2, name: 'Off-peak', pricePerKwh: 0.1, shareOfHoursPct: 75 },
    ];
    // 0.25 × 0.30 + 0.75 × 0.10 = 0.15 (arithmetic)
    expect(weightedBandPrice(bands)).toBeCloseTo(0.15, 10);
    expect(draftToInput({ ...filled(), tariff: 'time-of-use', timeOfUse: bands }).energyPricePerKwh).toBeCloseTo(0.15, 10);
    expect(weightedBandPrice([{ key: 3, name: 'x', pricePerKwh: null, shareOfHoursPct: 100 }])).toBeNull();
  });

  it('sends blank code and location on an edit so they can be cleared', () => {
    expect(draftToUpdate(filled())).toMatchObject({ code: '', location: '' });
  });

  it('puts the fields a server error names under those fields', () => {
    const form = useZodForm(siteCreateBody, labels);
    const named = form.applyServerError(
      new ApiError(400, 'invalid-input', 'voltageV: must be at most 15 kV', { field: 'voltageV' }),
    );
    expect(named).toBe(true);
    expect(form.error('voltageV')).toBe('Line voltage must be at most 15 kV');
  });
});
