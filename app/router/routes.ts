import type { RouteRecordRaw } from 'vue-router';
import { EDITORS, OUTBOX_READERS } from 'shared/roles';

/*
 * Every screen by name; pages load lazily. `meta.public` screens need no sign-in; `meta.roles`
 * limits a screen to those roles (the navigation guard in router/guard.ts enforces both, and the
 * drawer reads the same meta to decide what to show).
 */
const routes: RouteRecordRaw[] = [
  {
    path: '/',
    component: () => import('layouts/MainLayout.vue'),
    children: [
      { path: '', name: 'overview', component: () => import('pages/OverviewPage.vue') },
      { path: 'sites', name: 'sites', component: () => import('pages/SitesPage.vue') },
      {
        path: 'sites/new',
        name: 'site-new',
        component: () => import('pages/SiteFormPage.vue'),
        meta: { roles: EDITORS },
      },
      {
        path: 'sites/:id(\\d+)',
        name: 'site-detail',
        component: () => import('pages/SiteDetailPage.vue'),
        props: (route) => ({ id: Number(route.params.id) }),
      },
      {
        path: 'sites/:id(\\d+)/edit',
        name: 'site-edit',
        component: () => import('pages/SiteFormPage.vue'),
        props: (route) => ({ id: Number(route.params.id) }),
        meta: { roles: EDITORS },
      },
      { path: 'cases', name: 'cases', component: () => import('pages/CasesPage.vue') },
      { path: 'retrofits', name: 'retrofits', component: () => import('pages/RetrofitLogPage.vue') },
      {
        path: 'retrofits/:id(\\d+)',
        name: 'retrofit-detail',
        component: () => import('pages/RetrofitLogDetailPage.vue'),
        props: (route) => ({ id: Number(route.params.id) }),
      },
      {
        path: 'cases/:id(\\d+)',
        name: 'case-detail',
        component: () => import('pages/CaseReportPage.vue'),
        props: (route) => ({ id: Number(route.params.id) }),
      },
      { path: 'motors', name: 'motors', component: () => import('pages/MotorsPage.vue') },
      {
        path: 'motors/new',
        name: 'motor-new',
        component: () => import('pages/MotorFormPage.vue'),
        props: (route) => ({ id: null, siteId: route.query.siteId ? Number(route.query.siteId) : null }),
        meta: { roles: EDITORS },
      },
      {
        path: 'motors/:id(\\d+)',
        name: 'motor-detail',
        component: () => import('pages/MotorDetailPage.vue'),
        props: (route) => ({ id: Number(route.params.id) }),
      },
      {
        path: 'motors/:id(\\d+)/edit',
        name: 'motor-edit',
        component: () => import('pages/MotorFormPage.vue'),
        props: (route) => ({ id: Number(route.params.id) }),
        meta: { roles: EDITORS },
      },
      {
        path: 'intake',
        name: 'intake',
        component: () => import('pages/IntakePage.vue'),
        meta: { roles: EDITORS },
      },
      { path: 'quick-study', name: 'quick-study', component: () => import('pages/QuickStudyPage.vue') },
      {
        path: 'studies/:id(\\d+)',
        name: 'study-detail',
        redirect: (to) => ({ name: 'quick-study', query: { studyId: String(to.params.id) } }),
      },
      { path: 'screening', name: 'screening', component: () => import('pages/ScreeningPage.vue') },
      {
        path: 'bldc-sizing',
        name: 'bldc-sizing',
        component: () => import('pages/BldcSizingPage.vue'),
        props: (route) => ({
          motorId: /^\d+$/.test(String(route.query.motorId ?? '')) ? Number(route.query.motorId) : null,
          designId: /^\d+$/.test(String(route.query.designId ?? '')) ? Number(route.query.designId) : null,
        }),
      },
      { path: 'settings/price-book', name: 'settings-price-book', component: () => import('pages/SettingsPriceBookPage.vue') },
      { path: 'settings/assumptions', name: 'settings-assumptions', component: () => import('pages/SettingsAssumptionsPage.vue') },
      { path: 'settings/materials', name: 'settings-materials', component: () => import('pages/SettingsMaterialsPage.vue') },
      {
        path: 'settings/team',
        name: 'team',
        component: () => import('pages/TeamPage.vue'),
        meta: { roles: ['admin'] },
      },
      {
        path: 'outbox/:id(\\d+)?',
        name: 'outbox',
        component: () => import('pages/OutboxPage.vue'),
        props: (route) => ({ id: route.params.id ? Number(route.params.id) : null }),
        meta: { roles: OUTBOX_READERS },
      },
      { path: 'account', name: 'account', component: () => import('pages/AccountPage.vue') },
      { path: 'not-allowed', name: 'not-allowed', component: () => import('pages/NotAllowedPage.vue') },
    ],
  },
  {
    path: '/',
    component: () => import('layouts/AuthLayout.vue'),
    children: [
      { path: 'sign-in', name: 'sign-in', component: () => import('pages/SignInPage.vue'), meta: { public: true } },
      {
        path: 'invitation',
        name: 'invitation',
        component: () => import('pages/InvitationPage.vue'),
        meta: { public: true },
      },
    ],
  },
  // Always last.
  {
    path: '/:catchAll(.*)*',
    name: 'not-found',
    component: () => import('pages/ErrorNotFoundPage.vue'),
    meta: { public: true },
  },
];

export default routes;
