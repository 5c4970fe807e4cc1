/// <reference types="vitest/config" />
import { fileURLToPath, URL } from 'node:url'
import { defineConfig } from 'vite'
import vue from '@vitejs/plugin-vue'

const alias = {
  '@': fileURLToPath(new URL('./src', import.meta.url)),
  '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
  '@server': fileURLToPath(new URL('./server', import.meta.url)),
}

export default defineConfig({
  plugins: [vue()],
  resolve: { alias },
  server: {
    host: '127.0.0.1',
    proxy: { '/api': { target: `http://127.0.0.1:${process.env.PORT ?? 8420}`, changeOrigin: false } },
  },
  build: { outDir: 'dist', sourcemap: false, chunkSizeWarningLimit: 900, manifest: true },
  test: {
    coverage: {
      provider: 'v8',
      include: ['shared/engine/**/*.ts'],
      reporter: ['text-summary', 'text'],
      reportsDirectory: 'coverage',
      thresholds: { lines: 95 },
    },
    projects: [
      {
        extends: true,
        test: { name: 'shared', include: ['tests/shared/**/*.test.ts'], environment: 'node' },
      },
      {
        extends: true,
        test: {
          name: 'server',
          include: ['tests/server/**/*.test.ts'],
          environment: 'node',
          // One database: API test files run one after another.
          fileParallelism: false,
          testTimeout: 30000,
          hookTimeout: 60000,
        },
      },
      {
        extends: true,
        test: { name: 'client', include: ['tests/client/**/*.test.ts'], environment: 'happy-dom' },
      },
      {
        extends: true,
        test: { name: 'e2e', include: ['tests/e2e/**/*.test.ts'], environment: 'node', fileParallelism: false, testTimeout: 120000, hookTimeout: 120000 },
      },
    ],
  },
})
