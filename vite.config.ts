import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vitest/config';

// One config for the web build, the dev server and the three test projects.
export default defineConfig({
  root: '.',
  plugins: [react(), tailwindcss()],
  build: { outDir: 'dist/web', emptyOutDir: true, sourcemap: true },
  server: {
    host: '127.0.0.1',
    port: 5173,
    strictPort: true,
    proxy: { '/api': { target: 'http://127.0.0.1:3000', changeOrigin: false } },
  },
  test: {
    projects: [
      {
        test: {
          name: 'unit',
          include: ['apps/*/src/**/*.test.{ts,tsx}', 'packages/*/src/**/*.test.ts', 'scripts/bench/**/*.test.ts', 'tests/architecture/**/*.test.ts'],
          exclude: ['**/*.int.test.ts', '**/node_modules/**'],
          environment: 'node',
        },
      },
      {
        test: {
          name: 'integration',
          include: ['apps/*/src/**/*.int.test.ts', 'packages/*/src/**/*.int.test.ts', 'tests/api/**/*.int.test.ts'],
          globalSetup: ['tests/setup/integration-global.ts'],
          environment: 'node',
          testTimeout: 30_000,
          hookTimeout: 60_000,
          // One MariaDB for all files: tests isolate by unique rinks and e-mails, so files may run in parallel.
          fileParallelism: true,
          maxWorkers: 2,
        },
      },
      {
        test: {
          name: 'e2e',
          include: ['tests/e2e/**/*.e2e.test.ts'],
          globalSetup: ['tests/setup/e2e-global.ts'],
          environment: 'node',
          testTimeout: 90_000,
          hookTimeout: 120_000,
          fileParallelism: false,
        },
      },
    ],
  },
});
