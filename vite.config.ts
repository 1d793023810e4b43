import { fileURLToPath, URL } from 'node:url'
import { defineConfig } from 'vite'
import vue from '@vitejs/plugin-vue'

// The client is served by the Express server in production; `npm run dev:client` proxies the API.
export default defineConfig({
  plugins: [vue()],
  resolve: {
    alias: {
      '@': fileURLToPath(new URL('./src', import.meta.url)),
      '@shared': fileURLToPath(new URL('./shared', import.meta.url)),
    },
  },
  server: { proxy: { '/api': 'http://localhost:3000' } },
  build: { outDir: 'dist', chunkSizeWarningLimit: 1200 },
})
