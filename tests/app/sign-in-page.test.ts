import { afterEach, describe, expect, it, vi } from 'vitest';

// Under vitest 'quasar' resolves to its server build (the "node" export condition); use the browser one.
vi.mock('quasar', () => vi.importActual('quasar/dist/quasar.client.js'));
import SignInPage from 'pages/SignInPage.vue';
import { createHarness, fakeFetch, flushPromises, mountInLayout, demoUser } from './mount';

afterEach(() => {
  vi.unstubAllGlobals();
  document.body.innerHTML = '';
});

async function setUp() {
  const harness = createHarness(null);
  await harness.router.push({ name: 'sign-in' });
  const wrapper = mountInLayout(SignInPage, harness);
  await flushPromises();
  return { harness, wrapper };
}

describe('SignInPage', () => {
  it('shows the schema messages under the fields when submitted empty', async () => {
    const { calls } = fakeFetch({});
    const { wrapper } = await setUp();
    await wrapper.get('form').trigger('submit');
    await flushPromises();
    expect(wrapper.text()).toContain('E-mail must be an e-mail address');
    expect(wrapper.text()).toContain('Password is required');
    expect(calls).toHaveLength(0);
  });

  it('says clearly when the e-mail and password do not match', async () => {
    fakeFetch({
      'GET /api/auth/csrf': { body: { token: 'abc' } },
      'POST /api/auth/login': {
        status: 401,
        body: { error: { code: 'invalid-credentials', message: 'The e-mail or the password is wrong.' } },
      },
    });
    const { wrapper } = await setUp();
    await wrapper.get('[data-testid="signin-email"]').setValue('admin@kestrel.example');
    await wrapper.get('[data-testid="signin-password"]').setValue('wrong-password');
    await wrapper.get('form').trigger('submit');
    await flushPromises();
    expect(wrapper.get('[data-testid="signin-error"]').text()).toContain('The e-mail or the password is wrong.');
  });

  it('shows the server’s retry advice when sign-in is rate limited', async () => {
    fakeFetch({
      'GET /api/auth/csrf': { body: { token: 'abc' } },
      'POST /api/auth/login': {
        status: 429,
        body: {
          error: {
            code: 'too-many-attempts',
            message: 'Too many sign-in attempts from this address. Wait 15 minutes and try again.',
          },
        },
      },
    });
    const { wrapper } = await setUp();
    await wrapper.get('[data-testid="signin-email"]').setValue('admin@kestrel.example');
    await wrapper.get('[data-testid="signin-password"]').setValue('whatever');
    await wrapper.get('form').trigger('submit');
    await flushPromises();
    expect(wrapper.get('[data-testid="signin-error"]').text()).toContain('Wait 15 minutes');
  });

  it('signs in with the CSRF token and returns to the page asked for', async () => {
    const { calls } = fakeFetch({
      'GET /api/auth/csrf': { body: { token: 'pre-login-token' } },
      'POST /api/auth/login': { body: { user: demoUser('engineer'), csrfToken: 'session-token' } },
      'GET /api/sites': { body: { items: [], total: 0, page: 1, pageSize: 25 } },
    });
    const harness = createHarness(null);
    await harness.router.push({ name: 'sign-in', query: { redirect: '/sites' } });
    const wrapper = mountInLayout(SignInPage, harness);
    await wrapper.get('[data-testid="signin-email"]').setValue('Engineer@Kestrel.example ');
    await wrapper.get('[data-testid="signin-password"]').setValue('statorline-demo');
    await wrapper.get('form').trigger('submit');
    await flushPromises();
    const login = calls.find((call) => call.method === 'POST');
    expect(new Headers(login?.init.headers).get('x-csrf-token')).toBe('pre-login-token');
    expect(JSON.parse(String(login?.init.body))).toEqual({ email: 'engineer@kestrel.example', password: 'statorline-demo' });
    // The lazy layout and page load first.
    await vi.waitFor(() => expect(harness.router.currentRoute.value.name).toBe('sites'), { timeout: 5000 });
  });
});
