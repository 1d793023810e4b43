import { fileURLToPath, URL } from 'node:url'
import { defineConfig } from 'vitest/config'
import vue from '@vitejs/plugin-vue'

const alias = {
  '@': fileURLToPath(new URL('./src', import.meta.url)),
  '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
}

// Node for the model and the server, happy-dom for components, a long timeout for the browser.
export default defineConfig({
  resolve: { alias },
  test: {
    projects: [
      { resolve: { alias }, test: { name: 'unit', include: ['tests/unit/**/*.test.ts'], environment: 'node' } },
      { resolve: { alias }, test: { name: 'reference', include: ['tests/reference/**/*.test.ts'], environment: 'node' } },
      {
        resolve: { alias },
        test: {
          name: 'api', include: ['tests/api/**/*.test.ts'], environment: 'node', testTimeout: 60_000, hookTimeout: 120_000,
          globalSetup: ['tests/support/global-setup.ts'],
        },
      },
      {
        plugins: [vue()],
        resolve: { alias },
        test: { name: 'component', include: ['tests/component/**/*.test.ts'], environment: 'happy-dom' },
      },
      {
        resolve: { alias },
        test: {
          name: 'e2e', include: ['tests/e2e/**/*.test.ts'], environment: 'node',
          testTimeout: 120_000, hookTimeout: 180_000, fileParallelism: false,
        },
      },
    ],
  },
})
