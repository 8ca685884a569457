import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));
vi.setConfig({ testTimeout: 30_000 });

import RetrofitLogDetailPage from 'pages/RetrofitLogDetailPage.vue';
import type { RetrofitDetail, RetrofitPatch } from 'shared/retrofit';
import type { Role } from 'shared/roles';
import { stubXhr } from './fake-xhr';
import { createHarness, fakeFetch, flushPromises, mountInLayout, type FakeRoutes } from './mount';
import { detail, meterData, noMeterData, notReady, verification } from './retrofit-log-fixtures';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const testid = (id: string) => `[data-testid="${id}"]`;
/** Quasar teleports dialogs to the body. */
const inBody = (selector: string) => document.body.querySelector<HTMLElement>(selector);

async function open(role: Role, retrofit: RetrofitDetail = detail(), extra: FakeRoutes = {}) {
  const fake = fakeFetch({
    'GET /api/retrofits/12': { body: retrofit },
    'GET /api/retrofits/12/meter-data': { body: noMeterData },
    'GET /api/retrofits/12/verification': { body: notReady },
    'GET /api/auth/csrf': { body: { token: 'test-token' } },
    ...extra,
  });
  const harness = createHarness(role);
  await harness.router.push({ name: 'retrofit-detail', params: { id: 12 } });
  const wrapper = mountInLayout(RetrofitLogDetailPage, harness, {}, { id: 12 });
  await flushPromises();
  return { wrapper, harness, ...fake };
}

/** Types into a Quasar field of the teleported dialog (the test id sits on the input or its wrapper). */
async function type(id: string, value: string) {
  const input = inBody(`input[data-testid="${id}"], [data-testid="${id}"] input, textarea[data-testid="${id}"]`) as HTMLInputElement;
  input.value = value;
  input.dispatchEvent(new Event('input'));
  await flushPromises();
}

const patches = (calls: { method: string; url: URL; init: RequestInit }[]) =>
  calls.filter((call) => call.method === 'PATCH').map((call) => JSON.parse(String(call.init.body)) as RetrofitPatch);

describe('RetrofitLogDetailPage', () => {
  it('shows where an ordered retrofit stands, who did each step, the cautions and only the next step the engineer may take', async () => {
    const { wrapper } = await open('engineer', detail({ optionCode: 'bldc-vsd' }));
    expect(wrapper.get(testid('retrofit-title')).text()).toContain('W-P-101 · BLDC motor with drive, + speed control');
    expect(wrapper.get(testid('retrofit-status')).text()).toBe('Ordered');
    const state = (status: string) => wrapper.get(testid(`retrofit-step-${status}`)).attributes('data-state');
    expect(['proposed', 'approved', 'ordered', 'installed', 'verified'].map(state)).toEqual(['done', 'done', 'current', 'todo', 'todo']);
    expect(wrapper.get(testid('retrofit-step-approved')).text()).toContain('Priya Holloway');
    const cautions = wrapper.get(testid('retrofit-cautions')).text();
    expect(cautions).toContain('licensed electrician or engineer under local codes');
    expect(cautions).toContain('harmonics and EMC');
    expect(cautions).toContain('permanent-magnet rotor is hazardous');
    expect(cautions).toContain('stop and lock the shaft');
    expect(wrapper.find(testid('retrofit-transition-installed')).exists()).toBe(true);
    expect(wrapper.find(testid('retrofit-transition-approved')).exists()).toBe(false);
    expect(wrapper.get(testid('retrofit-history')).text()).toContain('Go ahead.');
    expect(wrapper.get(testid('retrofit-verification-missing')).text()).toContain('reporting meter data');
    // The reporting period waits for the installation.
    expect(wrapper.get(testid('retrofit-meter-reporting')).text()).toContain('record it first');
  });

  it('keeps the magnet cautions away from an induction motor', async () => {
    const { wrapper } = await open('engineer', detail({ optionCode: 'ie4' }));
    const cautions = wrapper.get(testid('retrofit-cautions')).text();
    expect(cautions).toContain('local codes');
    expect(cautions).not.toContain('permanent-magnet');
    expect(cautions).not.toContain('EMC');
  });

  it('records an installation with its date, nameplate, installer and photos, checked by the server’s schema first', async () => {
    const installed = detail({
      status: 'installed',
      version: 4,
      installationDate: '2026-11-12',
      allowedTransitions: ['verified'],
      installedEquipment: { installedBy: 'Ridgeway Electrical', motor: { type: 'IE4 induction', ratedPowerKw: 18.5, efficiencyPct: 94.1 } },
    });
    let patched = false;
    const { wrapper, calls } = await open('engineer', detail(), {
      'GET /api/retrofits/12': () => ({ body: patched ? installed : detail() }),
      'PATCH /api/retrofits/12': () => {
        patched = true;
        return { body: installed };
      },
    });
    const sent = stubXhr(() => ({ status: 201, body: { id: 40, retrofitId: 12, kind: 'photo', fileName: 'nameplate.jpg', contentType: 'image/jpeg', sizeBytes: 3, userId: 7, createdAt: '2026-11-12T10:00:00.000Z' } }));

    await wrapper.get(testid('retrofit-transition-installed')).trigger('click');
    await flushPromises();
    expect(inBody(testid('retrofit-transition-dialog'))?.textContent).toContain('Installation is electrical work');
    await type('retrofit-installation-date', '2026-11-12');
    await type('retrofit-installed-by', 'Ridgeway Electrical');
    await type('retrofit-motor-type', 'IE4 induction');
    await type('retrofit-motor-kw', '18.5');
    await type('retrofit-motor-efficiency', '194.1');
    inBody(testid('retrofit-transition-confirm'))!.click();
    await flushPromises();
    // 194.1 % is refused in the browser with the schema's message; nothing is sent.
    expect(inBody(testid('retrofit-transition-dialog'))?.textContent).toContain('Motor efficiency must be at most 100 %');
    expect(patches(calls)).toHaveLength(0);

    await type('retrofit-motor-efficiency', '94.1');
    const photo = new File([new Uint8Array([0xff, 0xd8, 0xff])], 'nameplate.jpg', { type: 'image/jpeg' });
    const fileField = wrapper.findAllComponents({ name: 'QFile' }).find((component) => component.attributes('data-testid') === 'retrofit-installation-files' || component.find(testid('retrofit-installation-files')).exists());
    fileField!.vm.$emit('update:modelValue', [photo]);
    await flushPromises();
    inBody(testid('retrofit-transition-confirm'))!.click();
    await flushPromises();
    await new Promise((resolve) => setTimeout(resolve, 10));
    await flushPromises();

    expect(patches(calls)).toEqual([
      {
        version: 3,
        status: 'installed',
        installationDate: '2026-11-12',
        installedEquipment: { installedBy: 'Ridgeway Electrical', motor: { type: 'IE4 induction', ratedPowerKw: 18.5, efficiencyPct: 94.1 } },
        actualCapex: null,
        rebateReceived: null,
      },
    ]);
    expect(sent).toHaveLength(1);
    expect(sent[0]!.url).toBe('/api/retrofits/12/files');
    expect(sent[0]!.form.get('kind')).toBe('photo');
    expect(wrapper.get(testid('retrofit-status')).text()).toBe('Installed');
    expect(wrapper.get(testid('retrofit-installed-by-shown')).text()).toBe('Ridgeway Electrical');
    expect(wrapper.get(testid('retrofit-new-motor')).text()).toBe('IE4 induction · 18.5 kW · 94.1 %');
  });

  it('lets an approver approve or reject, and asks why before a rejection', async () => {
    const proposed = detail({ status: 'proposed', allowedTransitions: ['approved', 'rejected'], events: detail().events.slice(0, 1) });
    const { wrapper, calls } = await open('approver', proposed, { 'PATCH /api/retrofits/12': { body: detail({ status: 'rejected', allowedTransitions: [] }) } });
    expect(wrapper.find(testid('retrofit-transition-approved')).exists()).toBe(true);
    expect(wrapper.find(testid('retrofit-record-edit')).exists()).toBe(false);
    expect(wrapper.find(testid('retrofit-meter-baseline-file')).exists()).toBe(false);
    await wrapper.get(testid('retrofit-transition-rejected')).trigger('click');
    await flushPromises();
    expect(inBody(testid('retrofit-transition-dialog'))?.textContent).toContain('Emeka Lindqvist (who proposed it) is e-mailed');
    inBody(testid('retrofit-transition-confirm'))!.click();
    await flushPromises();
    expect(inBody(testid('retrofit-transition-dialog'))?.textContent).toContain('Comment is required when rejecting');
    expect(patches(calls)).toHaveLength(0);
    await type('retrofit-comment', 'Payback too long at this site.');
    inBody(testid('retrofit-transition-confirm'))!.click();
    await flushPromises();
    expect(patches(calls)).toEqual([{ version: 3, status: 'rejected', comment: 'Payback too long at this site.' }]);
    expect(wrapper.get(testid('retrofit-status')).text()).toBe('Rejected');
  });

  it('tells the user when someone else changed the retrofit first, and shows the current version', async () => {
    let reads = 0;
    const { wrapper } = await open('engineer', detail(), {
      'GET /api/retrofits/12': () => ({ body: detail(reads++ === 0 ? {} : { version: 4, notes: 'Changed by a colleague' }) }),
      'PATCH /api/retrofits/12': { status: 409, body: { error: { code: 'stale-version', message: 'This retrofit was changed by someone else', details: null } } },
    });
    await wrapper.get(testid('retrofit-transition-installed')).trigger('click');
    await flushPromises();
    inBody(testid('retrofit-transition-confirm'))!.click();
    await flushPromises();
    expect(inBody(testid('retrofit-transition-error'))?.textContent).toContain('Someone changed this retrofit meanwhile');
    expect(wrapper.get(testid('retrofit-notes')).text()).toBe('Changed by a colleague');
  });

  it('keeps the record editor’s edits on a stale version, says so with the banner, and reloads only when asked', async () => {
    let reads = 0;
    const { wrapper, calls } = await open('engineer', detail(), {
      'GET /api/retrofits/12': () => ({ body: detail(reads++ === 0 ? {} : { version: 4, notes: 'Changed by a colleague' }) }),
      'PATCH /api/retrofits/12': { status: 409, body: { error: { code: 'stale-version', message: 'This retrofit was changed by someone else', details: null } } },
    });
    await wrapper.get(testid('retrofit-record-edit')).trigger('click');
    await flushPromises();
    const notes = () => wrapper.get<HTMLTextAreaElement>(`${testid('retrofit-record-notes')} textarea, textarea${testid('retrofit-record-notes')}`);
    await notes().setValue('Cable gland replaced');
    await wrapper.get(testid('retrofit-record-save')).trigger('click');
    await flushPromises();
    expect(patches(calls)).toHaveLength(1);
    expect(wrapper.get(testid('retrofit-record-stale')).text()).toContain('Someone else saved this retrofit after you opened it');
    // The user's edit stays, and a second save cannot overwrite the colleague's version unseen.
    expect(notes().element.value).toBe('Cable gland replaced');
    expect(wrapper.get(testid('retrofit-record-save')).attributes('disabled')).toBeDefined();
    await wrapper.get(testid('retrofit-record-reload')).trigger('click');
    await flushPromises();
    expect(wrapper.find(testid('retrofit-record-stale')).exists()).toBe(false);
    expect(notes().element.value).toBe('Changed by a colleague');
  });

  it('shows the verified savings with units, uncertainty, realised share, both periods and the method', async () => {
    // The server answers no transition to a viewer.
    const installed = detail({ status: 'installed', allowedTransitions: [], installationDate: '2026-11-12' });
    const { wrapper } = await open('viewer', installed, {
      'GET /api/retrofits/12/meter-data': { body: meterData },
      'GET /api/retrofits/12/verification': { body: verification() },
    });
    expect(wrapper.get(testid('retrofit-verified-kwh')).text()).toBe('9,200 kWh/yr');
    expect(wrapper.get(testid('retrofit-uncertainty')).text()).toBe('± 420 kWh/yr at 90 % confidence');
    expect(wrapper.get(testid('retrofit-realised')).text()).toBe('92 %');
    expect(wrapper.get(testid('retrofit-adjusted-baseline')).text()).toBe('4,217 kWh');
    expect(wrapper.get(testid('retrofit-period-savings')).text()).toBe('178 kWh ± 8.1 kWh');
    expect(wrapper.get(testid('retrofit-verification')).text()).toContain('R² 0.999');
    // The realised chart compares predicted and verified in MWh/yr.
    expect(wrapper.get(testid('retrofit-realised-chart')).text()).toBe('[{"name":"Savings, MWh/yr","data":[10,9.2]}]');
    // The stored baseline with its gap, reported and not filled; the chart breaks there (null).
    expect(wrapper.get(testid('retrofit-meter-baseline-kwh')).text()).toBe('4,173 kWh');
    expect(wrapper.get(testid('retrofit-meter-baseline-stored')).text()).toContain('1, left out (never filled)');
    expect(wrapper.get(testid('retrofit-meter-chart')).text()).toContain('"y":null');
    // A viewer changes nothing.
    expect(wrapper.find(testid('retrofit-method')).exists()).toBe(false);
    expect(wrapper.find(testid('retrofit-transition-verified')).exists()).toBe(false);
    expect(wrapper.find(testid('retrofit-file')).exists()).toBe(false);
  });

  it('changes the method to option B on a named column of the meter files', async () => {
    const installed = detail({ status: 'installed', allowedTransitions: ['verified'] });
    const { wrapper, calls } = await open('engineer', installed, {
      'GET /api/retrofits/12/meter-data': { body: meterData },
      'GET /api/retrofits/12/verification': { body: verification() },
      'PATCH /api/retrofits/12': { body: detail({ status: 'installed', version: 4, independentVariable: 'Production [t]' }) },
    });
    const variable = wrapper.findAllComponents({ name: 'QSelect' }).find((select) => select.props('label') === 'Baseline adjusted by')!;
    expect((variable.props('options') as Array<{ label: string }>).map((option) => option.label)).toEqual(['Operating hours, from the metered power', 'Column “Production [t]”']);
    variable.vm.$emit('update:modelValue', 'Production [t]');
    await flushPromises();
    await wrapper.get(testid('retrofit-method-save')).trigger('click');
    await flushPromises();
    expect(patches(calls)).toEqual([{ version: 3, verificationMethod: 'B', independentVariable: 'Production [t]' }]);
    // The verification is asked again for the new method.
    expect(calls.filter((call) => call.url.pathname === '/api/retrofits/12/verification').length).toBe(2);
  });
});
