import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import tailwindcss from '@tailwindcss/vite';

const API_PORT = Number(process.env.PORT ?? 3000);

export default defineConfig({
  root: 'client',
  plugins: [react(), tailwindcss()],
  build: { outDir: '../dist/client', emptyOutDir: true },
  server: { proxy: { '/api': `http://127.0.0.1:${API_PORT}` } },
  test: {
    root: '.',
    // A stray `.only` fails the run instead of quietly running one test (the lint rule catches it first).
    allowOnly: false,
    projects: [
      {
        extends: true,
        test: {
          name: 'unit',
          include: ['tests/unit/**/*.test.ts'],
          environment: 'node',
          // Property-based and bit-for-bit tests over 20 000–50 000 generated values take 0.5–2 s on a quiet machine and
          // ran past the 5 s default (6–10 s) beside other work, seven of them at once; a time limit here would only
          // measure the machine. Speed is the benchmarks' job.
          testTimeout: 20_000,
        },
      },
      {
        // Components below the browser (Testing Library in happy-dom): forms' logic, with the network faked at fetch.
        extends: true,
        test: {
          name: 'client',
          include: ['tests/client/**/*.test.tsx'],
          environment: 'happy-dom',
          setupFiles: ['tests/client/setup.ts'],
          // A form test types and re-renders dozens of times; on a loaded 2-core machine that can pass the 5 s default.
          testTimeout: 20_000,
        },
      },
      {
        extends: true,
        test: {
          name: 'api',
          include: ['tests/api/**/*.test.ts'],
          environment: 'node',
          fileParallelism: false,
          setupFiles: ['tests/support/api-setup.ts'],
          // Real PostgreSQL and bcrypt under a loaded 2-core machine: a test that signs in fifty times
          // can pass 5 s, and a timed-out test keeps running into the next one. Speed is the benchmarks' job.
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
          fileParallelism: false,
          testTimeout: 90_000,
          hookTimeout: 120_000,
          // Browser pages under a loaded 2-core CI machine can take seconds to settle.
          expect: { poll: { timeout: 15_000 } },
        },
      },
    ],
  },
});
