// Vite build for the Sheaf web app: React, Tailwind (theme from tailwind.config.ts), /api proxy in dev.
import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig } from 'vite';

/** Charting libraries are large and only report pages need them: keep them in their own chunk. */
const chartModules = /[\\/]node_modules[\\/](vega|vega-[^\\/]+|vega-lite|d3-[^\\/]+)[\\/]/;

export default defineConfig({
  root: '.',
  plugins: [react(), tailwindcss()],
  build: {
    outDir: 'dist/web',
    emptyOutDir: true,
    // No source maps in the served build: they would publish the full source.
    sourcemap: false,
    // The lazily loaded chart chunk is ~0.9 MB; every page a first visit loads stays far below this.
    chunkSizeWarningLimit: 1000,
    rolldownOptions: {
      output: {
        codeSplitting: {
          groups: [{ name: 'vega', test: chartModules }],
        },
      },
    },
  },
  server: {
    host: '127.0.0.1',
    port: 5173,
    proxy: {
      '/api': { target: 'http://127.0.0.1:3000', changeOrigin: false },
    },
  },
  preview: { host: '127.0.0.1' },
});
