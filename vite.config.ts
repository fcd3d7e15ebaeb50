import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';
import { VitePWA } from 'vite-plugin-pwa';

export default defineConfig({
  plugins: [
    react(),
    tailwindcss(),
    // The app shell loads offline; the API is never cached (a stale record could be signed as current).
    VitePWA({
      registerType: 'autoUpdate',
      // An external registerSW.js, not an inline script: the Content-Security-Policy allows only 'self'.
      injectRegister: 'script',
      includeAssets: ['favicon.svg', 'hoodline-icon.svg'],
      manifest: {
        name: 'Hoodline',
        short_name: 'Hoodline',
        description: 'Locomotive walkaround inspection, findings pinned on the drawing',
        start_url: '/',
        scope: '/',
        display: 'standalone',
        background_color: '#f4f1e8',
        theme_color: '#262522',
        icons: [{ src: '/hoodline-icon.svg', sizes: 'any', type: 'image/svg+xml', purpose: 'any' }],
      },
      workbox: {
        globPatterns: ['**/*.{js,css,html,svg,woff2,woff,png,webp}'],
        maximumFileSizeToCacheInBytes: 3 * 1024 * 1024,
        navigateFallback: '/index.html',
        navigateFallbackDenylist: [/^\/api\//],
        cleanupOutdatedCaches: true,
        // No route for /api at all: the worker never answers it, so every API call goes to the network
        // (network-only without a hop through the worker) and a failed one is the client's offline case.
      },
    }),
  ],
  server: {
    host: '127.0.0.1',
    port: 5173,
    proxy: { '/api': { target: 'http://127.0.0.1:3001', changeOrigin: false } },
  },
  // No inlined data: assets, so the strict Content-Security-Policy (font-src 'self') holds.
  build: { outDir: 'dist', sourcemap: false, chunkSizeWarningLimit: 600, assetsInlineLimit: 0 },
});
