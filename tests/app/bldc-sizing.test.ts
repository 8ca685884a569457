import { afterEach, beforeAll, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));

import { sizeBldc, type BldcResult } from 'calc/bldc/index';
import BldcSizingCrossSection from 'components/BldcSizingCrossSection.vue';
import BldcSizingFeasibility from 'components/BldcSizingFeasibility.vue';
import BldcSizingWindingTable from 'components/BldcSizingWindingTable.vue';
import BldcSizingResultsTables from 'components/BldcSizingResultsTables.vue';
import BldcSizingPage from 'pages/BldcSizingPage.vue';
import { formFromMotor, requestFromForm } from 'components/bldc-sizing';
import type { DesignOutput } from 'shared/design';
import type { MotorOutput } from 'shared/motor';
import { createHarness, fakeFetch, flushPromises, mountInLayout, mountWithApp } from './mount';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

// Designs computed by calc in the test (slots and poles given, so no search: a few milliseconds).
let tooth: BldcResult; // 18 slots / 12 poles, double-layer tooth coils (README example)
let distributed: BldcResult; // 36 slots / 4 poles, distributed winding
beforeAll(() => {
  tooth = sizeBldc({ ratedPowerKw: 4, speedRpm: 1500, supplyVoltageV: 400, frequencyHz: 50, slots: 18, poles: 12, objective: 'efficiency' });
  distributed = sizeBldc({ ratedPowerKw: 11, speedRpm: 1460, supplyVoltageV: 400, frequencyHz: 50, frame: '160M', slots: 36, poles: 4 });
});

describe('BldcSizingCrossSection', () => {
  it.each([
    ['tooth-coil', () => tooth],
    ['distributed', () => distributed],
  ])('draws one slot per stator slot and 2p magnets of alternating polarity (%s)', (_kind, design) => {
    const result = design();
    expect(result.geometry).toBeDefined();
    const wrapper = mountWithApp(BldcSizingCrossSection, createHarness('engineer'), { props: { result } });
    expect(wrapper.findAll('[data-slot]')).toHaveLength(result.slots as number);
    const magnets = wrapper.findAll('[data-magnet]');
    expect(magnets).toHaveLength(result.poles as number);
    expect(magnets.map((m) => m.attributes('data-polarity')).join('')).toBe('NS'.repeat((result.poles as number) / 2));
    // Every coil side is drawn, coloured by its phase.
    expect(wrapper.findAll('[data-phase]')).toHaveLength(result.winding?.sides.length as number);
    // To scale: the stator circle has the design's radius in millimetres, with a scale bar.
    expect(Number(wrapper.get('[data-part="stator"]').attributes('r'))).toBeCloseTo((result.geometry?.statorOuterDiameterMm as number) / 2, 9);
    expect(Number(wrapper.get('[data-part="shaft"]').attributes('r'))).toBeCloseTo((result.geometry?.shaftDiameterMm as number) / 2, 9);
    expect(wrapper.get('[data-testid="bldc-cross-section-scale"]').text()).toMatch(/\d+ mm/);
    const svg = wrapper.get('svg');
    expect(svg.attributes('role')).toBe('img');
    expect(svg.get('title').text()).toContain(`${result.slots} slots, ${result.poles} poles`);
  });

  it('says there is nothing to draw when the request produced no design', () => {
    const wrapper = mountWithApp(BldcSizingCrossSection, createHarness('viewer'), { props: { result: null } });
    expect(wrapper.find('svg').exists()).toBe(false);
    expect(wrapper.text()).toContain('No geometry to draw');
  });
});

describe('BldcSizingWindingTable', () => {
  it.each([
    ['tooth-coil', () => tooth],
    ['distributed', () => distributed],
  ])('has one row per coil side with slot, layer, phase and direction (%s)', (_kind, design) => {
    const result = design();
    const wrapper = mountWithApp(BldcSizingWindingTable, createHarness('engineer'), { props: { result } });
    const rows = wrapper.findAll('[data-testid="bldc-winding-row"]');
    expect(rows).toHaveLength(result.winding?.sides.length as number);
    expect(rows).toHaveLength((result.slots as number) * (result.layers as number));
    const first = [...(result.winding?.sides ?? [])].sort((a, b) => a.slot - b.slot || a.layer - b.layer)[0];
    const cells = rows[0]?.findAll('td').map((td) => td.text()) ?? [];
    expect(cells[0]).toBe(String((first?.slot ?? 0) + 1));
    expect(cells[2]).toContain(first?.phase);
    expect(cells[3]).toContain(first?.direction === 1 ? '+' : '−');
    expect(wrapper.get('[data-testid="bldc-winding-factor"]').text()).toBe(
      new Intl.NumberFormat('en-GB', { maximumFractionDigits: 4 }).format(result.windingFactor as number),
    );
  });
});

describe('BldcSizingResultsTables', () => {
  it('shows the losses and masses with their unrounded values for comparison', () => {
    const wrapper = mountWithApp(BldcSizingResultsTables, createHarness('engineer'), { props: { result: tooth } });
    const losses = wrapper.get('[data-testid="bldc-losses"]');
    expect(Number(losses.get('[data-testid="bldc-value-copperW"]').attributes('data-value'))).toBe(tooth.losses?.copperW);
    expect(Number(losses.get('[data-testid="bldc-value-systemEfficiencyPct"]').attributes('data-value'))).toBe(tooth.systemEfficiencyPct);
    const masses = wrapper.get('[data-testid="bldc-masses"]');
    expect(Number(masses.get('[data-testid="bldc-value-massTotalKg"]').attributes('data-value'))).toBe(tooth.massKg?.total);
    expect(masses.get('[data-testid="bldc-value-massTotalKg"]').text()).toContain('kg');
  });
});

describe('BldcSizingFeasibility', () => {
  it('names the limiting constraint and the nearest feasible alternative when no design fields are present', async () => {
    const infeasible: BldcResult = {
      feasible: false,
      limitingConstraint: 'stator outer diameter',
      constraints: [{ name: 'stator outer diameter', value: 300, limit: 256, unit: 'mm', sense: 'max', satisfied: false, utilisation: 300 / 256 }],
      frame: { system: 'IEC', designation: '160M', shaftHeightMm: 160, maxStatorOuterDiameterMm: 256, maxStackLengthMm: 189 },
      alternatives: [],
      search: { combinations: 40, candidatesEvaluated: 0, feasibleCount: 0 },
      nearestFeasible: {
        field: 'frame',
        value: '180M',
        description: 'Next larger frame 180M',
        design: { slots: 36, poles: 6, layers: 2, coilPitch: 5, feasible: true, limitingConstraint: 'voltage', splitRatio: 0.6, statorOuterDiameterMm: 288, stackLengthMm: 200, efficiencyPct: 95, systemEfficiencyPct: 93, activeMaterialCost: 200, totalMassKg: 40, why: '' },
      },
      assumptions: [],
    };
    const wrapper = mountWithApp(BldcSizingFeasibility, createHarness('engineer'), { props: { result: infeasible } });
    expect(wrapper.get('[data-testid="bldc-feasibility-verdict"]').text()).toBe('No feasible design');
    expect(wrapper.get('[data-testid="bldc-feasibility-limiting"]').text()).toContain('stator outer diameter');
    expect(wrapper.get('[data-testid="bldc-nearest-feasible"]').text()).toContain('Next larger frame 180M');
    expect(wrapper.find('[data-testid="bldc-demag"]').exists()).toBe(false);
    await wrapper.get('[data-testid="bldc-apply-nearest"]').trigger('click');
    expect(wrapper.emitted('apply')?.[0]).toEqual(['frame', '180M']);
  });
});

const motor: MotorOutput = {
  id: 41, siteId: 1, siteName: 'Kestrel Valley Dairy', tag: 'VD-PMP-107', description: 'CIP supply pump', area: 'CIP station', application: 'pump',
  ratedPowerKw: 11, speedRpm: 1460, poles: 4, voltageV: 400, frequencyHz: 50, ratedCurrentA: 21, efficiencyClass: 'IE2', nameplateEfficiencyPct: null,
  powerFactor: 0.84, frame: '160M', enclosure: 'IP55', manufacturer: null, yearInstalled: 2012, rewinds: 0, controlMethod: 'throttle-valve',
  hoursPerYear: 6000, loadFactor: 0.7, dutyProfile: null, status: 'in-service', notes: null, importBatchId: null, version: 3,
  createdAt: '2026-01-01T00:00:00.000Z', updatedAt: '2026-01-01T00:00:00.000Z',
};

const settings = { materials: { magnets: [{ name: 'N42H', builtIn: true, remanenceT: 1.3, maxTemperatureC: 120 }], steels: [{ name: 'M330-35A', builtIn: true, thicknessM: 0.00035 }] } };

describe('BldcSizingPage', { timeout: 30_000 }, () => {
  it('fills the inputs from a register motor and posts the size-bldc request with the motor', async () => {
    const created = { ...tooth, id: 12, appliedDefaults: ['minEfficiencyPct: IE4'] };
    const { calls } = fakeFetch({
      'GET /api/motors/41': { body: motor },
      'GET /api/settings': { body: settings },
      'GET /api/designs': { body: { items: [], total: 0, page: 1, pageSize: 50 } },
      'POST /api/designs': { status: 201, body: created },
      'GET /api/designs/12': { status: 404 },
      'GET /api/auth/csrf': { body: { token: 't' } },
    });
    const harness = createHarness('engineer');
    await harness.router.push({ name: 'bldc-sizing', query: { motorId: '41' } });
    const wrapper = mountInLayout(BldcSizingPage, harness, {}, { motorId: 41, designId: null });
    await flushPromises();
    expect(wrapper.get('[data-testid="bldc-subtitle"]').text()).toContain('VD-PMP-107');
    expect((wrapper.get('input[data-testid="bldc-input-ratedPowerKw"]').element as HTMLInputElement).value).toBe('11');
    expect((wrapper.get('input[data-testid="bldc-input-speedRpm"]').element as HTMLInputElement).value).toBe('1460');
    await wrapper.get('[data-testid="bldc-design"]').trigger('click');
    await flushPromises();
    const post = calls.find((call) => call.method === 'POST' && call.url.pathname === '/api/designs');
    expect(JSON.parse(String(post?.init.body))).toEqual({ ...requestFromForm(formFromMotor(motor)), name: 'BLDC for VD-PMP-107', motorId: 41 });
    expect(JSON.parse(String(post?.init.body))).toMatchObject({ ratedPowerKw: 11, speedRpm: 1460, supplyVoltageV: 400, frequencyHz: 50, frame: '160M' });
    expect(wrapper.get('[data-testid="bldc-shown-badge"]').text()).toBe('Saved design #12');
    expect(wrapper.findAll('[data-slot]')).toHaveLength(18);
    expect(wrapper.find('[data-testid="bldc-use-design"]').exists()).toBe(true);
  });

  it('opens a stored design read-only for a viewer', async () => {
    const stored: DesignOutput = {
      id: 5, name: 'Dairy pump BLDC', motorId: null, motorTag: null, linkedMotorIds: [], ratedPowerKw: 4, speedRpm: 1500, feasible: true,
      limitingConstraint: tooth.limitingConstraint, slots: 18, poles: 12, frame: '112M', efficiencyPct: tooth.efficiencyPct ?? null,
      systemEfficiencyPct: tooth.systemEfficiencyPct ?? null, activeMaterialCost: tooth.activeMaterialCost ?? null, totalMassKg: tooth.massKg?.total ?? null,
      createdById: 2, createdByName: 'Emeka Lindqvist', createdAt: '2026-02-01T10:00:00.000Z',
      input: { ratedPowerKw: 4, speedRpm: 1500, supplyVoltageV: 400, frequencyHz: 50, slots: 18, poles: 12, objective: 'efficiency' },
      appliedDefaults: [], result: tooth,
    };
    fakeFetch({
      'GET /api/designs/5': { body: stored },
      'GET /api/settings': { body: settings },
      'GET /api/designs': { body: { items: [], total: 0, page: 1, pageSize: 50 } },
    });
    const harness = createHarness('viewer');
    const wrapper = mountInLayout(BldcSizingPage, harness, {}, { motorId: null, designId: 5 });
    await flushPromises();
    expect(wrapper.find('[data-testid="bldc-design"]').exists()).toBe(false);
    expect(wrapper.get('[data-testid="bldc-readonly-note"]').text()).toContain('Read only');
    expect(wrapper.get('[data-testid="bldc-feasibility-verdict"]').text()).toBe('Feasible design');
    expect(wrapper.get('[data-testid="bldc-key-slots-poles"]').text()).toBe('18 / 12');
    expect(wrapper.findAll('[data-testid="bldc-winding-row"]')).toHaveLength(36);
    expect(wrapper.find('[data-testid="bldc-use-design"]').exists()).toBe(false);
    expect(wrapper.get('[data-testid="bldc-cautions"]').text()).toContain('pacemakers');
  });
});
