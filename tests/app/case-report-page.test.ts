import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));

import CaseReportPage from 'pages/CaseReportPage.vue';
import type { CaseDecided, CaseOutput } from 'shared/case';
import type { Role } from 'shared/roles';
import { createHarness, fakeFetch, flushPromises, mountInLayout, type FakeRoutes } from './mount';
import { dairyCase, dairySummary } from './case-fixtures';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const list = { items: [dairySummary], total: 1, page: 1, pageSize: 100 };

async function open(role: Role, snapshot: CaseOutput = dairyCase, extra: FakeRoutes = {}) {
  const fake = fakeFetch({ 'GET /api/cases/41': { body: snapshot }, 'GET /api/cases': { body: list }, ...extra });
  const harness = createHarness(role);
  await harness.router.push({ name: 'case-detail', params: { id: 41 } });
  const wrapper = mountInLayout(CaseReportPage, harness, {}, { id: 41 });
  await flushPromises();
  return { wrapper, harness, ...fake };
}

const testid = (id: string) => `[data-testid="${id}"]`;

describe('CaseReportPage', () => {
  it('shows the headline figures, the tables and every chart’s series', async () => {
    const { wrapper } = await open('viewer');
    expect(wrapper.get(testid('case-title')).text()).toBe('Dairy plant');
    expect(wrapper.get(testid('case-status')).text()).toContain('Awaiting decision');
    expect(wrapper.get(testid('case-headline-energy')).text()).toBe('176 MWh/yr → 133 MWh/yr');
    expect(wrapper.get(testid('case-headline-cost')).text()).toBe('€7,740');
    expect(wrapper.get(testid('case-headline-payback')).text()).toBe('1.3 yr');
    expect(wrapper.get(testid('case-headline-npv')).text()).toBe('€62,500');
    expect(wrapper.get(testid('case-headline-motors')).text()).toBe('2 of 3');
    expect(wrapper.get(testid('case-sites-table')).text()).toContain('176');
    expect(wrapper.get(testid('case-sites-table')).text()).toContain('43.0 (24.4 %)');
    expect(wrapper.get(testid('case-areas-table')).text()).toContain('Cooling');
    // The recommended list leaves out the motor that is kept, until asked.
    const items = wrapper.get(testid('case-items-table'));
    expect(items.text()).toContain('DP-F-101');
    expect(items.text()).not.toContain('DP-C-310');
    expect(wrapper.get(testid('case-chart-tornado')).text()).toContain('Energy price');
    expect(wrapper.get(testid('case-chart-cashflow')).text()).toContain('-9800');
    expect(wrapper.get(testid('case-chart-by-site')).text()).toContain('[7740]');
    expect(wrapper.get(testid('case-chart-energy')).text()).toContain('176');
    expect(wrapper.get(testid('case-snapshot-banner')).text()).toContain('Later edits to motors or sites do not change it');
    expect(wrapper.get(testid('case-cautions')).text()).toContain('not a design approval');
    expect(wrapper.get(testid('case-export-pdf')).attributes('href')).toBe('/api/cases/41/export?format=pdf');
    expect(wrapper.get(testid('case-export-xlsx')).attributes('href')).toBe('/api/cases/41/export?format=xlsx');
  });

  it('lets only an approver decide, and tells the others why they cannot', async () => {
    const approver = await open('approver');
    expect(approver.wrapper.get(testid('case-approve')).attributes('disabled')).toBeUndefined();
    expect(approver.wrapper.get(testid('case-reject')).attributes('disabled')).toBeUndefined();
    expect(approver.wrapper.find(testid('case-decision-blocked')).exists()).toBe(false);
    expect(approver.wrapper.find(testid('case-send')).exists()).toBe(false);
    expect(approver.wrapper.find(testid('case-regenerate')).exists()).toBe(false);

    const engineer = await open('engineer');
    expect(engineer.wrapper.find(testid('case-approve')).exists()).toBe(false);
    expect(engineer.wrapper.find(testid('case-reject')).exists()).toBe(false);
    expect(engineer.wrapper.get(testid('case-decision-blocked')).text()).toContain('An approver of the organisation approves or rejects it');
    expect(engineer.wrapper.find(testid('case-send')).exists()).toBe(true);
    expect(engineer.wrapper.find(testid('case-regenerate')).exists()).toBe(true);

    const viewer = await open('viewer');
    expect(viewer.wrapper.find(testid('case-approve')).exists()).toBe(false);
    expect(viewer.wrapper.find(testid('case-decision-blocked')).exists()).toBe(true);
    expect(viewer.wrapper.find(testid('case-send')).exists()).toBe(false);
  }, 30_000);

  it('asks for a comment before recording an approval, then shows who approved and why', async () => {
    const decidedSummary = {
      ...dairySummary,
      status: 'approved' as const,
      decidedBy: { id: 3, name: 'Ada Approver', email: 'approver@kestrel.example' },
      decidedAt: '2026-12-01T10:00:00.000Z',
      decisionComment: 'Go ahead in the spring shutdown.',
    };
    const decided: CaseDecided = { case: decidedSummary, retrofits: { created: 2, approved: 0, rejected: 0 } };
    const { wrapper, calls } = await open('approver', dairyCase, { 'POST /api/cases/41/decision': { body: decided } });
    await wrapper.get(testid('case-approve')).trigger('click');
    await flushPromises();
    const submit = document.querySelector<HTMLButtonElement>(testid('case-decision-submit'))!;
    submit.click();
    await flushPromises();
    expect(calls.some((call) => call.method === 'POST')).toBe(false);
    expect(document.body.textContent).toContain('A comment is required');

    const comment = document.querySelector<HTMLTextAreaElement>(`textarea${testid('case-decision-comment')}, ${testid('case-decision-comment')} textarea`)!;
    comment.value = 'Go ahead in the spring shutdown.';
    comment.dispatchEvent(new Event('input'));
    await flushPromises();
    submit.click();
    await flushPromises();
    const post = calls.find((call) => call.method === 'POST');
    expect(post?.url.pathname).toBe('/api/cases/41/decision');
    expect(JSON.parse(String(post?.init.body))).toEqual({ decision: 'approved', comment: 'Go ahead in the spring shutdown.' });
    expect(wrapper.get(testid('case-status')).text()).toContain('Approved');
    expect(wrapper.get(testid('case-decision')).text()).toContain('Ada Approver');
    expect(wrapper.get(testid('case-decision-comment-shown')).text()).toBe('Go ahead in the spring shutdown.');
    // Decided: no more buttons.
    expect(wrapper.find(testid('case-approve')).exists()).toBe(false);
  });

  it('sends to the approvers and extra addresses, refusing a malformed one', async () => {
    const sent = {
      case: { ...dairySummary, lastSentAt: '2026-12-01T11:00:00.000Z' },
      send: { id: 6, sentAt: '2026-12-01T11:00:00.000Z', sentBy: null, to: ['approver@kestrel.example', 'cfo@kestrel.example'], messageId: null },
    };
    const { wrapper, calls } = await open('engineer', dairyCase, { 'POST /api/cases/41/send': { body: sent } });
    await wrapper.get(testid('case-send')).trigger('click');
    await flushPromises();
    const input = document.querySelector<HTMLTextAreaElement>(`${testid('case-send-to')} textarea, textarea${testid('case-send-to')}, ${testid('case-send-to')} input`)!;
    input.value = 'cfo@kestrel.example, not-an-address';
    input.dispatchEvent(new Event('input'));
    await flushPromises();
    document.querySelector<HTMLButtonElement>(testid('case-send-submit'))!.click();
    await flushPromises();
    expect(document.body.textContent).toContain('“not-an-address” is not an e-mail address');
    expect(calls.some((call) => call.method === 'POST')).toBe(false);

    input.value = 'cfo@kestrel.example';
    input.dispatchEvent(new Event('input'));
    await flushPromises();
    document.querySelector<HTMLButtonElement>(testid('case-send-submit'))!.click();
    await flushPromises();
    const post = calls.find((call) => call.method === 'POST');
    expect(JSON.parse(String(post?.init.body))).toEqual({ to: ['cfo@kestrel.example'] });
    expect(wrapper.get(testid('case-sends')).text()).toContain('cfo@kestrel.example');
  });

  it('says what went wrong when the case cannot be loaded', async () => {
    fakeFetch({ 'GET /api/cases/41': { status: 404, body: { error: { code: 'not-found', message: 'Business case 41 was not found.' } } } });
    const harness = createHarness('viewer');
    const wrapper = mountInLayout(CaseReportPage, harness, {}, { id: 41 });
    await flushPromises();
    expect(wrapper.get(testid('case-error')).text()).toContain('Not found');
  });
});
