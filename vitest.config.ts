import { defineConfig } from 'vitest/config';
import vue from '@vitejs/plugin-vue';
import { quasar } from '@quasar/vite-plugin';
import { fileURLToPath } from 'node:url';

const maths = fileURLToPath(new URL('./backend/src/maths', import.meta.url));
const apiTypes = fileURLToPath(new URL('./backend/src/api-types', import.meta.url));

// Three kinds of test, one command: node-side tests share a private PostgreSQL
// cluster started once by the global setup; component tests run under jsdom;
// browser tests drive Debian's chromium against the real server.
export default defineConfig({
  test: {
    projects: [
      {
        test: {
          name: 'node',
          environment: 'node',
          sequence: { groupOrder: 0 },
          include: ['tests/unit/**/*.test.ts', 'tests/api/**/*.test.ts', 'tests/collectors/**/*.test.ts', 'tests/ops/**/*.test.ts', 'tests/faults/**/*.test.ts'],
          globalSetup: ['tests/setup/global-postgres.ts'],
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        plugins: [vue({ template: { transformAssetUrls: {} } }), quasar({ sassVariables: false })],
        resolve: { alias: { '@brimwatch/maths': maths, '@brimwatch/api-types': apiTypes, '@': fileURLToPath(new URL('./frontend/src', import.meta.url)) } },
        test: {
          name: 'frontend',
          environment: 'jsdom',
          sequence: { groupOrder: 0 },
          include: ['tests/frontend/**/*.test.ts'],
          setupFiles: ['tests/frontend/setup.ts'],
          server: { deps: { inline: ['quasar'] } },
        },
      },
      {
        test: {
          name: 'browser',
          environment: 'node',
          // After the node and component tests: chromium wants the machine's cores to itself.
          sequence: { groupOrder: 1 },
          include: ['tests/browser/**/*.test.ts'],
          globalSetup: ['tests/setup/global-postgres.ts'],
          testTimeout: 60_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
