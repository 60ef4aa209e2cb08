// Build, dev-server and test configuration (kept under src/ so the top level stays small).
import { defineConfig } from 'vitest/config';
import react from '@vitejs/plugin-react';
import { fileURLToPath } from 'node:url';

const root = fileURLToPath(new URL('..', import.meta.url));

export default defineConfig({
  root,
  plugins: [react()],
  server: { port: 5173, strictPort: true },
  worker: { format: 'es' },
  test: {
    root,
    include: ['tests/**/*.test.{ts,tsx}'],
    environment: 'node',
    setupFiles: ['tests/setup.ts'],
    testTimeout: 60000,
    hookTimeout: 120000,
    pool: 'forks',
  },
});
