/// <reference types="vitest/config" />
import { fileURLToPath, URL } from 'node:url';
import { defineConfig } from 'vite';
import vue from '@vitejs/plugin-vue';
import AutoImport from 'unplugin-auto-import/vite';
import Components from 'unplugin-vue-components/vite';
import { ElementPlusResolver } from 'unplugin-vue-components/resolvers';

const alias = {
  '@': fileURLToPath(new URL('./src', import.meta.url)),
  '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
  '@server': fileURLToPath(new URL('./server', import.meta.url)),
};

export default defineConfig({
  plugins: [
    vue(),
    // Element Plus is tree-shaken: only the components and styles a page uses are bundled.
    AutoImport({ resolvers: [ElementPlusResolver()], dts: false }),
    Components({ resolvers: [ElementPlusResolver()], dts: false }),
  ],
  resolve: { alias },
  build: { outDir: 'dist', emptyOutDir: true, chunkSizeWarningLimit: 900 },
  server: {
    proxy: {
      '/api': { target: `http://127.0.0.1:${process.env.SADDLESTEP_API_PORT ?? 4780}`, changeOrigin: false },
      '/socket.io': { target: `ws://127.0.0.1:${process.env.SADDLESTEP_API_PORT ?? 4780}`, ws: true },
    },
  },
  test: {
    // Server and browser tests mostly wait on MariaDB and Chromium, so more workers than cores pay off.
    maxWorkers: 4,
    projects: [
      {
        resolve: { alias },
        test: {
          name: 'shared',
          include: ['tests/shared/**/*.test.ts'],
          environment: 'node',
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'server',
          include: ['tests/server/**/*.test.ts'],
          environment: 'node',
          testTimeout: 30_000,
          hookTimeout: 60_000,
        },
      },
      {
        resolve: { alias },
        test: {
          name: 'browser',
          include: ['tests/browser/**/*.test.ts'],
          environment: 'node',
          testTimeout: 60_000,
          hookTimeout: 90_000,
          fileParallelism: false,
        },
      },
    ],
    coverage: {
      provider: 'v8',
      include: ['shared/**/*.ts'],
      reporter: ['text-summary', 'text'],
      thresholds: { lines: 95 },
    },
  },
});
