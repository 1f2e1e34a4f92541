/// <reference types="vitest/config" />
import { defineConfig } from 'vite';
import vue from '@vitejs/plugin-vue';
import { quasar } from '@quasar/vite-plugin';
import { fileURLToPath } from 'node:url';

const here = (path: string): string => fileURLToPath(new URL(path, import.meta.url));

// The maths and the API's answer types live with the server so that server,
// collectors and browser share one source of truth; Vite reaches them through
// aliases outside this root.
export default defineConfig({
  root: here('.'),
  plugins: [vue(), quasar({ sassVariables: false })],
  resolve: {
    alias: {
      '@brimwatch/maths': here('../backend/src/maths'),
      '@brimwatch/api-types': here('../backend/src/api-types'),
      '@': here('./src'),
    },
  },
  build: {
    outDir: here('./dist'),
    emptyOutDir: true,
  },
  server: {
    host: '127.0.0.1',
    fs: { allow: [here('..')] },
    proxy: { '/api': 'http://127.0.0.1:8080' },
  },
});
