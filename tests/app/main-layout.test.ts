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
  it('shows a viewer only Overview and Sites', async () => {
    expect(await navTestIds('viewer')).toEqual(['nav-overview', 'nav-sites', 'nav-cases']);
  });

  it('adds the Outbox for engineers and approvers', async () => {
    expect(await navTestIds('engineer')).toEqual(['nav-overview', 'nav-sites', 'nav-cases', 'nav-outbox']);
    expect(await navTestIds('approver')).toEqual(['nav-overview', 'nav-sites', 'nav-cases', 'nav-outbox']);
  });

  it('shows an admin Settings › Team as well', async () => {
    const harness = createHarness('admin');
    const wrapper = mountWithApp(MainLayout, harness, { global: { stubs: { RouterView: true } } });
    await flushPromises();
    expect(wrapper.findAll('[data-testid^="nav-"]').map((item) => item.attributes('data-testid'))).toEqual([
      'nav-overview',
      'nav-sites',
      'nav-cases',
      'nav-outbox',
      'nav-team',
    ]);
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
