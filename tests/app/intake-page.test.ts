import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));
// Mounting a whole page takes seconds on a busy machine.
vi.setConfig({ testTimeout: 30_000 });

import IntakeMapping from 'components/IntakeMapping.vue';
import IntakePage from 'pages/IntakePage.vue';
import { resetPowerUnitForTests } from 'composables/usePowerUnit';
import { createHarness, fakeFetch, flushPromises, mountInLayout, mountWithApp } from './mount';
import { stubXhr } from './fake-xhr';
import { importDetail, sitesList } from './motor-fixtures';

beforeEach(() => {
  localStorage.clear();
  resetPowerUnitForTests();
});
afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const batchList = (items: unknown[] = []) => ({ body: { items, total: items.length, page: 1, pageSize: 10 } });

describe('IntakeMapping', () => {
  it('lists every header with its first values and the field it becomes', async () => {
    const batch = importDetail();
    const wrapper = mountWithApp(IntakeMapping, createHarness('engineer'), {
      props: { headers: batch.headers, modelValue: batch.mapping, samples: { 'Motor tag': ['SV-1', 'D-P-101'], Power: ['7.5 kW', '10 hp'] } },
    });
    await flushPromises();
    const rows = wrapper.findAll('[data-testid^="intake-mapping-row-"]');
    expect(rows.map((row) => row.find('td').text())).toEqual(['Motor tag', 'Power', 'Speed', 'Remarks']);
    expect(rows[1]?.text()).toContain('7.5 kW · 10 hp');
    expect(rows[1]?.text()).toContain('Rated power (kW) *');
    expect(rows[3]?.text()).toContain('Ignore this column');
  });

  it('names required fields without a column and two columns feeding one field', async () => {
    const wrapper = mountWithApp(IntakeMapping, createHarness('engineer'), {
      props: { headers: ['A', 'B'], modelValue: { A: 'speedRpm', B: 'speedRpm' }, unmappedRequired: ['tag', 'ratedPowerKw'] },
    });
    await flushPromises();
    expect(wrapper.get('[data-testid="intake-mapping-missing"]').text()).toContain('No column gives Tag, Rated power (kW)');
    expect(wrapper.text()).toContain('Speed (rpm) is fed by “A” and “B”; keep one.');
  });
});

describe('IntakePage', () => {
  it('resumes a batch from the address at its check, with counts, duplicates and row issues', async () => {
    const { calls } = fakeFetch({
      'GET /api/sites': { body: sitesList },
      'GET /api/imports': batchList([importDetail()]),
      'GET /api/imports/5': { body: importDetail() },
    });
    const harness = createHarness('engineer');
    await harness.router.push({ name: 'intake', query: { batch: '5' } });
    const wrapper = mountInLayout(IntakePage, harness);
    await flushPromises();
    const preview = wrapper.get('[data-testid="intake-preview"]');
    expect(wrapper.get('[data-testid="intake-count-total"]').text()).toContain('3');
    expect(wrapper.get('[data-testid="intake-count-invalid"]').text()).toContain('1');
    expect(preview.text()).toContain('Rated power (kW) “lots”: is not a number');
    expect(preview.text()).toContain('Poles: worked out as 4 from 1460 rpm at 50 Hz');
    expect(wrapper.get('[data-testid="intake-duplicates"]').text()).toContain('D-P-101');
    expect(wrapper.get('[data-testid="intake-commit"]').text()).toContain('Import 2 valid rows');
    expect(wrapper.get('[data-testid="intake-batches"]').text()).toContain('walk-down.xlsx');

    await wrapper.get('[data-testid="intake-count-invalid"]').trigger('click');
    await flushPromises();
    expect(calls.at(-1)?.url.searchParams.get('filter')).toBe('invalid');
  });

  it('goes back to the columns, lists the headers, and validates again with a changed mapping', async () => {
    const { calls } = fakeFetch({
      'GET /api/sites': { body: sitesList },
      'GET /api/imports': batchList(),
      'GET /api/imports/5': { body: importDetail() },
      'GET /api/auth/csrf': { body: { token: 't' } },
      'PUT /api/imports/5/mapping': { body: importDetail({ mapping: { 'Motor tag': 'tag', Power: 'ratedPowerKw', Speed: 'speedRpm', Remarks: 'notes' } }) },
    });
    const harness = createHarness('engineer');
    await harness.router.push({ name: 'intake', query: { batch: '5' } });
    const wrapper = mountInLayout(IntakePage, harness);
    await flushPromises();
    const back = wrapper.findAll('button').find((button) => button.text() === 'Back to the columns');
    await back?.trigger('click');
    await flushPromises();
    const mapping = wrapper.get('[data-testid="intake-mapping"]');
    expect(mapping.text()).toContain('Motor tag');
    expect(mapping.text()).toContain('noisy bearing');
    expect(wrapper.get('[data-testid="intake-apply-mapping"]').text()).toContain('Continue to the check');

    // Map "Remarks" to notes through the component's own event (QSelect's menu needs a real layout).
    wrapper.findComponent(IntakeMapping).vm.$emit('update:modelValue', { ...importDetail().mapping, Remarks: 'notes' });
    await flushPromises();
    expect(wrapper.get('[data-testid="intake-apply-mapping"]').text()).toContain('Check the rows again');
    await wrapper.get('[data-testid="intake-apply-mapping"]').trigger('click');
    await flushPromises();
    const put = calls.find((call) => call.method === 'PUT');
    expect(JSON.parse(String(put?.init.body))).toEqual({ mapping: { 'Motor tag': 'tag', Power: 'ratedPowerKw', Speed: 'speedRpm', Remarks: 'notes' } });
    expect(wrapper.find('[data-testid="intake-preview"]').isVisible()).toBe(true);
  });

  it('commits and shows what was created, updated and skipped', async () => {
    let committed = false;
    const { calls } = fakeFetch({
      'GET /api/sites': { body: sitesList },
      'GET /api/imports': batchList(),
      'GET /api/imports/5': () => ({
        body: committed ? importDetail({ status: 'committed', progress: 1, createdCount: 1, updatedCount: 1, committedAt: '2026-02-01T09:05:00.000Z' }) : importDetail(),
      }),
      'GET /api/auth/csrf': { body: { token: 't' } },
      'POST /api/imports/5/commit': () => {
        committed = true;
        return { body: { created: 1, updated: 1, skipped: 1 } };
      },
    });
    const harness = createHarness('engineer');
    await harness.router.push({ name: 'intake', query: { batch: '5' } });
    const wrapper = mountInLayout(IntakePage, harness);
    await flushPromises();
    await wrapper.get('[data-testid="intake-commit"]').trigger('click');
    await flushPromises();
    expect(calls.some((call) => call.method === 'POST' && call.url.pathname === '/api/imports/5/commit')).toBe(true);
    const result = wrapper.get('[data-testid="intake-result"]');
    expect(wrapper.get('[data-testid="intake-result-created"]').text()).toBe('1');
    expect(wrapper.get('[data-testid="intake-result-updated"]').text()).toBe('1');
    expect(wrapper.get('[data-testid="intake-result-skipped"]').text()).toBe('1');
    expect(result.find('[data-testid="intake-undo"]').exists()).toBe(true);
  });

  it('shows progress while the server is still committing, and the result when it is done', async () => {
    vi.useFakeTimers({ toFake: ['setTimeout', 'clearTimeout'] });
    let polls = 0;
    fakeFetch({
      'GET /api/sites': { body: sitesList },
      'GET /api/imports': batchList(),
      'GET /api/imports/5': () => {
        polls += 1;
        return {
          body:
            polls === 1
              ? importDetail({ status: 'committing', progress: 0.4 })
              : importDetail({ status: 'committed', progress: 1, createdCount: 2, updatedCount: 0, committedAt: '2026-02-01T09:05:00.000Z' }),
        };
      },
    });
    const harness = createHarness('engineer');
    await harness.router.push({ name: 'intake', query: { batch: '5' } });
    const wrapper = mountInLayout(IntakePage, harness);
    await flushPromises();
    expect(wrapper.get('[data-testid="intake-progress"]').text()).toContain('Writing the motors to the register… 40 %');
    await vi.advanceTimersByTimeAsync(1000);
    await flushPromises();
    vi.useRealTimers();
    expect(wrapper.get('[data-testid="intake-result-created"]').text()).toBe('2');
    expect(polls).toBe(2);
  });

  it('shows the server’s own words for a file it refuses', async () => {
    fakeFetch({ 'GET /api/sites': { body: sitesList }, 'GET /api/imports': batchList(), 'GET /api/auth/csrf': { body: { token: 't' } } });
    const sent = stubXhr(() => ({ status: 413, body: { error: { code: 'too-large', message: 'The file is larger than 10 MB.' } } }));
    const harness = createHarness('engineer');
    await harness.router.push({ name: 'intake' });
    const wrapper = mountInLayout(IntakePage, harness);
    await flushPromises();
    expect(wrapper.get('[data-testid="intake-upload"]').attributes('disabled')).toBeDefined();

    const page = wrapper.findComponent(IntakePage);
    // QFile and QSelect need a real layout to pick from; set the two choices on the page directly.
    const state = (page.vm.$ as unknown as { setupState: { siteId: number | null; file: File | null } }).setupState;
    state.siteId = 1;
    state.file = new File(['Tag,Power\nP-1,7.5 kW\n'], 'list.csv', { type: 'text/csv' });
    await flushPromises();
    await wrapper.get('[data-testid="intake-upload"]').trigger('click');
    await flushPromises();
    await vi.waitFor(() => expect(wrapper.find('[data-testid="intake-upload-error"]').exists()).toBe(true));
    const error = wrapper.get('[data-testid="intake-upload-error"]').text();
    expect(error).toContain('The file is too large');
    expect(error).toContain('The file is larger than 10 MB.');
    expect(sent[0]?.url).toBe('/api/imports');
    expect(sent[0]?.headers['x-csrf-token']).toBe('t');
    expect(sent[0]?.form.get('siteId')).toBe('1');
    expect((sent[0]?.form.get('file') as File).name).toBe('list.csv');
  });
});
