import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));

import CasesPage from 'pages/CasesPage.vue';
import type { SiteOutput } from 'shared/site';
import { createHarness, fakeFetch, flushPromises, mountInLayout } from './mount';
import { dairyCase, dairySummary } from './case-fixtures';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const organisationCase = { ...dairySummary, id: 42, scope: 'all' as const, siteId: null, title: 'Kestrel Valley Foods', version: 1, status: 'approved' as const };
const list = { items: [dairySummary, organisationCase], total: 2, page: 1, pageSize: 25 };

const dairySite = { id: 1, name: 'Dairy plant', motorCount: 70, installedKw: 1200 } as SiteOutput;

describe('CasesPage', () => {
  it('lists the cases newest first with scope, version, our status wording and headline figures', async () => {
    const { calls } = fakeFetch({ 'GET /api/cases': { body: list } });
    const wrapper = mountInLayout(CasesPage, createHarness('viewer'));
    await flushPromises();
    expect(calls[0]?.url.search).toBe('?page=1&pageSize=25&sort=-createdAt');
    const table = wrapper.get('[data-testid="cases-table"]').text();
    expect(table).toContain('Dairy plant');
    expect(table).toContain('Whole organisation');
    expect(table).toContain('v2');
    expect(table).toContain('Awaiting decision');
    expect(table).toContain('Approved');
    expect(table).toContain('€7,740');
    expect(table).toContain('1.3 yr');
    expect(wrapper.find('[data-testid="cases-new"]').exists()).toBe(false);
  });

  it('lets an engineer generate a case for a site and opens it', async () => {
    const { calls } = fakeFetch({
      'GET /api/cases': { body: { items: [], total: 0, page: 1, pageSize: 25 } },
      'GET /api/sites': { body: { items: [dairySite], total: 1, page: 1, pageSize: 500 } },
      'POST /api/cases': { status: 201, body: dairyCase },
      'GET /api/cases/41': { body: dairyCase },
    });
    const harness = createHarness('engineer');
    await harness.router.push({ name: 'cases' });
    const wrapper = mountInLayout(CasesPage, harness);
    await flushPromises();
    const push = vi.spyOn(harness.router, 'push').mockResolvedValue(undefined);
    expect(wrapper.text()).toContain('No business case yet.');
    await wrapper.get('[data-testid="cases-new"]').trigger('click');
    await flushPromises();

    // Without a choice, nothing is generated.
    document.querySelector<HTMLButtonElement>('[data-testid="case-generate"]')!.click();
    await flushPromises();
    expect(document.body.textContent).toContain('Choose a site or the whole organisation');
    expect(calls.some((call) => call.method === 'POST')).toBe(false);

    document.querySelector<HTMLElement>('[data-testid="case-new-scope"]')!.click();
    await flushPromises();
    document.querySelector<HTMLElement>('[data-testid="case-new-scope-option-1"]')!.click();
    await flushPromises();
    document.querySelector<HTMLButtonElement>('[data-testid="case-generate"]')!.click();
    await flushPromises();
    const post = calls.find((call) => call.method === 'POST');
    expect(JSON.parse(String(post?.init.body))).toEqual({ siteId: 1 });
    expect(push).toHaveBeenCalledWith({ name: 'case-detail', params: { id: 41 } });
  }, 20_000);
});
