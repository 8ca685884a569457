// Quasar CLI configuration. The client source lives in app/ (not Quasar's default src/):
// sourceFiles and the folder aliases below point the CLI there; see DEVELOPERS.md.
import { defineConfig } from '#q-app/wrappers';
import { fileURLToPath } from 'node:url';

const fromRoot = (path: string) => fileURLToPath(new URL(path, import.meta.url));

export default defineConfig(() => ({
  boot: ['api', 'charts'],
  css: ['app.css'],
  extras: ['material-icons'],
  sourceFiles: {
    rootComponent: 'app/App.vue',
    router: 'app/router/index',
    store: 'app/stores/index',
  },
  build: {
    target: { browser: ['es2022', 'firefox115', 'chrome115', 'safari14'], node: 'node20' },
    typescript: { strict: true, vueShim: true },
    vueRouterMode: 'history',
    // STATORLINE_DIST lets parallel builds (and their servers) use folders of their own.
    distDir: process.env.STATORLINE_DIST ?? 'dist/spa',
    alias: {
      src: fromRoot('./app'),
      components: fromRoot('./app/components'),
      composables: fromRoot('./app/composables'),
      layouts: fromRoot('./app/layouts'),
      pages: fromRoot('./app/pages'),
      assets: fromRoot('./app/assets'),
      boot: fromRoot('./app/boot'),
      stores: fromRoot('./app/stores'),
      calc: fromRoot('./calc'),
      shared: fromRoot('./server/shared'),
    },
    extendViteConf(viteConf) {
      viteConf.publicDir = fromRoot('./app/public');
      // Never inline fonts or images as data: URLs: the content security policy allows only the app's own files.
      viteConf.build = { ...viteConf.build, assetsInlineLimit: 0 };
      viteConf.server = {
        ...viteConf.server,
        watch: { ignored: ['**/.data/**', '**/.artifacts/**', '**/server/**', '**/tests/**'] },
      };
    },
  },
  devServer: {
    host: '127.0.0.1',
    port: 9000,
    open: false,
    proxy: { '/api': 'http://127.0.0.1:3000' },
  },
  framework: {
    config: {
      brand: {
        primary: '#1f5f5b',
        secondary: '#c9822b',
        accent: '#5b4b8a',
        positive: '#2e7d32',
        negative: '#b3261e',
        info: '#2f6690',
        warning: '#b7791f',
      },
    },
    iconSet: 'material-icons',
    lang: 'en-GB',
    plugins: ['Notify', 'Dialog', 'Loading'],
  },
}));
