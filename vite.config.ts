import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

export default defineConfig({
  plugins: [react(), tailwindcss()],
  server: {
    host: '127.0.0.1',
    port: 5173,
    proxy: { '/api': { target: 'http://127.0.0.1:3001', changeOrigin: false } },
  },
  // No inlined data: assets, so the strict Content-Security-Policy (font-src 'self') holds.
  build: { outDir: 'dist', sourcemap: false, chunkSizeWarningLimit: 600, assetsInlineLimit: 0 },
});
