import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { fileURLToPath } from 'node:url';
import { defineConfig } from 'vite';

// The canvas bench page (bench/canvas.html), built on its own so the app's build is left alone.
// bench/canvas.ts passes the output directory.
export default defineConfig({
  root: fileURLToPath(new URL('.', import.meta.url)),
  base: './',
  plugins: [react(), tailwindcss()],
  logLevel: 'warn',
  build: {
    sourcemap: false,
    chunkSizeWarningLimit: 2000,
    rollupOptions: { input: fileURLToPath(new URL('./canvas.html', import.meta.url)) },
  },
});
