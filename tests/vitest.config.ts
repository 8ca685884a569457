import { defineConfig } from 'vitest/config';
import vue from '@vitejs/plugin-vue';
import { fileURLToPath } from 'node:url';

const fromRoot = (path: string) => fileURLToPath(new URL(`../${path}`, import.meta.url));

const alias = {
  src: fromRoot('app'),
  components: fromRoot('app/components'),
  composables: fromRoot('app/composables'),
  layouts: fromRoot('app/layouts'),
  pages: fromRoot('app/pages'),
  boot: fromRoot('app/boot'),
  stores: fromRoot('app/stores'),
  calc: fromRoot('calc'),
  shared: fromRoot('server/shared'),
};

export default defineConfig({
  root: fromRoot(''),
  resolve: { alias },
  test: {
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        extends: true,
        plugins: [vue()],
        test: {
          name: 'app',
          include: ['tests/app/**/*.test.ts'],
          environment: 'happy-dom',
        },
      },
      {
        extends: true,
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/database-setup.ts'],
          fileParallelism: false,
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.test.ts'],
          environment: 'node',
          globalSetup: ['tests/support/e2e-setup.ts'],
          fileParallelism: false,
          testTimeout: 60_000,
          hookTimeout: 180_000,
        },
      },
    ],
  },
});
