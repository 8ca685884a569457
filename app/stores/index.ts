import { defineStore } from '#q-app/wrappers';
import { createPinia } from 'pinia';

/*
 * Setup stores live beside this file, one per concern: session-store.ts (useSessionStore),
 * site-store.ts (useSiteStore).
 */
export default defineStore(() => createPinia());
