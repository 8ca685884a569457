import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));

import MainLayout from 'layouts/MainLayout.vue';
import type { Role } from 'shared/roles';
import { createHarness, fakeFetch, flushPromises, mountWithApp } from './mount';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

async function navTestIds(role: Role): Promise<string[]> {
  const harness = createHarness(role);
  const wrapper = mountWithApp(MainLayout, harness, { global: { stubs: { RouterView: true } } });
  await flushPromises();
  return wrapper.findAll('[data-testid^="nav-"]').map((item) => item.attributes('data-testid') ?? '');
}

describe('MainLayout', () => {
  // Every role reads the register, the reports and the settings; only editors see Intake; only admins the Team.
  it('shows a viewer the reading screens and none of the editing or admin ones', async () => {
    const ids = await navTestIds('viewer');
    expect(ids).toEqual(expect.arrayContaining(['nav-overview', 'nav-sites', 'nav-motors', 'nav-cases', 'nav-retrofits']));
    for (const hidden of ['nav-intake', 'nav-outbox', 'nav-team']) expect(ids).not.toContain(hidden);
  });

  it('adds Intake for engineers, the Outbox for engineers and approvers, and keeps Team from both', async () => {
    const engineer = await navTestIds('engineer');
    expect(engineer).toEqual(expect.arrayContaining(['nav-intake', 'nav-outbox', 'nav-quick-study', 'nav-bldc-sizing']));
    expect(engineer).not.toContain('nav-team');
    const approver = await navTestIds('approver');
    expect(approver).toContain('nav-outbox');
    expect(approver).not.toContain('nav-intake');
    expect(approver).not.toContain('nav-team');
  });

  it('shows an admin Settings › Team as well, in the order of the screen list', async () => {
    const harness = createHarness('admin');
    const wrapper = mountWithApp(MainLayout, harness, { global: { stubs: { RouterView: true } } });
    await flushPromises();
    const ids = wrapper.findAll('[data-testid^="nav-"]').map((item) => item.attributes('data-testid'));
    expect(ids).toContain('nav-team');
    expect(ids.indexOf('nav-overview')).toBe(0);
    expect(ids.indexOf('nav-motors')).toBeLessThan(ids.indexOf('nav-intake'));
    expect(ids.indexOf('nav-cases')).toBeLessThan(ids.indexOf('nav-retrofits'));
    expect(wrapper.text()).toContain('Settings');
  });

  it('names the signed-in user, role and organisation in the header', async () => {
    const harness = createHarness('approver');
    const wrapper = mountWithApp(MainLayout, harness, { global: { stubs: { RouterView: true } } });
    await flushPromises();
    const menu = wrapper.get('[data-testid="user-menu"]');
    expect(menu.text()).toContain('Demo approver');
    expect(menu.text()).toContain('Approver');
    expect(wrapper.text()).toContain('Kestrel Valley Foods');
    expect(wrapper.text()).toContain('Statorline');
  });

  it('signs out through the user menu and forgets the user', async () => {
    const { calls } = fakeFetch({ 'POST /api/auth/logout': { status: 204 } });
    const harness = createHarness('engineer');
    await harness.router.push({ name: 'account' });
    const wrapper = mountWithApp(MainLayout, harness, { global: { stubs: { RouterView: true } } });
    await flushPromises();
    await wrapper.get('[data-testid="user-menu"]').trigger('click');
    await flushPromises();
    const signOut = document.querySelector<HTMLElement>('[data-testid="menu-sign-out"]');
    expect(signOut).not.toBeNull();
    signOut?.click();
    await vi.waitFor(() => expect(harness.router.currentRoute.value.name).toBe('sign-in'), { timeout: 5000 });
    expect(calls.map((call) => `${call.method} ${call.url.pathname}`)).toEqual(['POST /api/auth/logout']);
    expect(new Headers(calls[0]?.init.headers).get('x-csrf-token')).toBe('test-token');
  });
});
