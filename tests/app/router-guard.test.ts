import { afterEach, describe, expect, it, vi } from 'vitest';
import { createHarness, demoUser, fakeFetch } from './mount';
import { safeRedirect } from 'src/router/guard';

afterEach(() => vi.unstubAllGlobals());

describe('navigation guard', () => {
  it('sends an anonymous user to sign-in with a way back', async () => {
    const { router } = createHarness(null);
    await router.push('/sites?page=2');
    expect(router.currentRoute.value.name).toBe('sign-in');
    expect(router.currentRoute.value.query.redirect).toBe('/sites?page=2');
  });

  it('lets anyone open the public pages', async () => {
    const { router } = createHarness(null);
    await router.push({ name: 'invitation', query: { token: 'x'.repeat(24) } });
    expect(router.currentRoute.value.name).toBe('invitation');
  });

  it('sends a viewer who opens Team or a site form to "not allowed"', async () => {
    const { router } = createHarness('viewer');
    await router.push({ name: 'team' });
    expect(router.currentRoute.value.name).toBe('not-allowed');
    expect(router.currentRoute.value.query.from).toBe('/settings/team');
    await router.push({ name: 'site-new' });
    expect(router.currentRoute.value.name).toBe('not-allowed');
  });

  it('keeps the Outbox from viewers but opens it to approvers', async () => {
    const viewer = createHarness('viewer');
    await viewer.router.push({ name: 'outbox' });
    expect(viewer.router.currentRoute.value.name).toBe('not-allowed');
    const approver = createHarness('approver');
    await approver.router.push({ name: 'outbox' });
    expect(approver.router.currentRoute.value.name).toBe('outbox');
  });

  it('lets an admin open Team', async () => {
    const { router } = createHarness('admin');
    await router.push({ name: 'team' });
    expect(router.currentRoute.value.name).toBe('team');
  });

  it('asks the server once who is signed in, then follows its answer', async () => {
    const { calls } = fakeFetch({ 'GET /api/auth/me': { body: { user: demoUser('engineer'), csrfToken: 't' } } });
    const { router, pinia } = createHarness(null);
    const { useSessionStore } = await import('stores/session-store');
    useSessionStore(pinia).loaded = false;
    await router.push({ name: 'site-new' });
    await router.push({ name: 'sites' });
    expect(router.currentRoute.value.name).toBe('sites');
    expect(calls.filter((call) => call.url.pathname === '/api/auth/me')).toHaveLength(1);
  });

  it('redirects only inside the app', () => {
    expect(safeRedirect('/sites/3')).toBe('/sites/3');
    expect(safeRedirect('//elsewhere.example/')).toBeNull();
    expect(safeRedirect('https://elsewhere.example/')).toBeNull();
    expect(safeRedirect(['/sites'])).toBeNull();
  });
});
