import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));

import InvitationPage from 'pages/InvitationPage.vue';
import { createHarness, demoUser, fakeFetch, flushPromises, mountInLayout } from './mount';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

const TOKEN = 'k'.repeat(32);

describe('InvitationPage', () => {
  it('explains a link without a token', async () => {
    const harness = createHarness(null);
    await harness.router.push({ name: 'invitation' });
    const wrapper = mountInLayout(InvitationPage, harness);
    await flushPromises();
    expect(wrapper.get('[data-testid="invitation-missing-token"]').text()).toContain('no invitation token');
  });

  it('checks the password rules and that both passwords agree before asking the server', async () => {
    const { calls } = fakeFetch({});
    const harness = createHarness(null);
    await harness.router.push({ name: 'invitation', query: { token: TOKEN } });
    const wrapper = mountInLayout(InvitationPage, harness);
    await flushPromises();
    await wrapper.get('[data-testid="invitation-name"]').setValue('Nia Okafor');
    await wrapper.get('[data-testid="invitation-password"]').setValue('short');
    await wrapper.get('[data-testid="invitation-confirm"]').setValue('different');
    await wrapper.get('form').trigger('submit');
    await flushPromises();
    expect(wrapper.text()).toContain('Password must be at least 10 characters');
    expect(wrapper.text()).toContain('The two passwords differ');
    expect(calls).toHaveLength(0);
  });

  it('signs the new member in and opens the Overview', async () => {
    const { calls } = fakeFetch({
      'GET /api/auth/csrf': { body: { token: 't' } },
      'POST /api/auth/invitations/accept': { body: { user: demoUser('viewer'), csrfToken: 'session' } },
      'GET /api/overview': {
        body: { organization: { id: 1, name: 'Kestrel Valley Foods' }, totals: { sites: 0, motors: 0, installedKw: 0 }, sites: [], byApplication: [] },
      },
    });
    const harness = createHarness(null);
    await harness.router.push({ name: 'invitation', query: { token: TOKEN } });
    const wrapper = mountInLayout(InvitationPage, harness);
    await flushPromises();
    await wrapper.get('[data-testid="invitation-name"]').setValue('Nia Okafor');
    await wrapper.get('[data-testid="invitation-password"]').setValue('a-long-passphrase');
    await wrapper.get('[data-testid="invitation-confirm"]').setValue('a-long-passphrase');
    await wrapper.get('form').trigger('submit');
    await flushPromises();
    const accept = calls.find((call) => call.method === 'POST');
    expect(JSON.parse(String(accept?.init.body))).toEqual({ token: TOKEN, name: 'Nia Okafor', password: 'a-long-passphrase' });
    await vi.waitFor(() => expect(harness.router.currentRoute.value.name).toBe('overview'), { timeout: 5000 });
  });
});
