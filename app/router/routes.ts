import type { RouteRecordRaw } from 'vue-router';

const routes: RouteRecordRaw[] = [
  { path: '/', name: 'home', component: () => import('pages/ErrorNotFoundPage.vue') },
  { path: '/:catchAll(.*)*', name: 'not-found', component: () => import('pages/ErrorNotFoundPage.vue') },
];

export default routes;
