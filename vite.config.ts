// Vite build for the Sheaf web app: React, Tailwind (theme from tailwind.config.ts), the offline
// app (web app manifest and a Workbox service worker), brotli and gzip copies of text assets,
// and the /api proxy in dev.
import fs from 'node:fs';
import path from 'node:path';
import zlib from 'node:zlib';
import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import { defineConfig, type Plugin } from 'vite';
import { VitePWA } from 'vite-plugin-pwa';

/** Charting libraries are large and only report pages need them: keep them in their own chunk. */
const chartModules = /[\\/]node_modules[\\/](vega|vega-[^\\/]+|vega-lite|d3-[^\\/]+)[\\/]/;

/** Text files worth compressing; the server sends the .br or .gz copy when the browser takes it. */
const COMPRESSIBLE = /\.(js|mjs|css|html|svg|json|webmanifest|txt)$/;

/** Writes name.br and name.gz beside every text asset over 1 kB, once, at build time. */
function precompress(): Plugin {
  let outDir = 'dist/web';
  return {
    name: 'sheaf-precompress',
    apply: 'build',
    configResolved(config) {
      outDir = path.resolve(config.root, config.build.outDir);
    },
    closeBundle: {
      order: 'post',
      sequential: true,
      handler() {
        const walk = (dir: string): string[] =>
          fs
            .readdirSync(dir, { withFileTypes: true })
            .flatMap((entry) =>
              entry.isDirectory() ? walk(path.join(dir, entry.name)) : [path.join(dir, entry.name)],
            );
        for (const file of walk(outDir)) {
          if (!COMPRESSIBLE.test(file)) continue;
          const body = fs.readFileSync(file);
          if (body.length < 1024) continue;
          fs.writeFileSync(
            `${file}.br`,
            zlib.brotliCompressSync(body, {
              params: {
                [zlib.constants.BROTLI_PARAM_QUALITY]: body.length > 300_000 ? 9 : 11,
                [zlib.constants.BROTLI_PARAM_SIZE_HINT]: body.length,
              },
            }),
          );
          fs.writeFileSync(`${file}.gz`, zlib.gzipSync(body, { level: 9 }));
        }
      },
    },
  };
}

export default defineConfig({
  root: '.',
  plugins: [
    react(),
    tailwindcss(),
    VitePWA({
      registerType: 'autoUpdate',
      // A same-origin script file: the Content-Security-Policy allows no inline script.
      injectRegister: 'script-defer',
      includeAssets: ['icons/apple-touch-icon.png', 'icons/sheaf-mark.svg'],
      manifest: {
        id: '/',
        name: 'Sheaf — seeding-rate trials',
        short_name: 'Sheaf',
        description:
          'Record and read on-farm seeding-rate trials: strip maps, counts, weights and reports, also without signal.',
        lang: 'en',
        start_url: '/',
        scope: '/',
        display: 'standalone',
        orientation: 'any',
        theme_color: '#1d4a2c',
        background_color: '#fbf6e9',
        icons: [
          { src: '/icons/sheaf-192.png', sizes: '192x192', type: 'image/png', purpose: 'any' },
          { src: '/icons/sheaf-512.png', sizes: '512x512', type: 'image/png', purpose: 'any' },
          {
            src: '/icons/sheaf-maskable-192.png',
            sizes: '192x192',
            type: 'image/png',
            purpose: 'maskable',
          },
          {
            src: '/icons/sheaf-maskable-512.png',
            sizes: '512x512',
            type: 'image/png',
            purpose: 'maskable',
          },
        ],
      },
      workbox: {
        // The app shell: every page's code and styles and the Latin font files. The chart chunk
        // (report pages only, ~0.9 MB) and other scripts' fonts load when first needed.
        globPatterns: ['**/*.{js,css,html,svg,png,woff2,webmanifest}'],
        globIgnores: [
          '**/vega-*.js',
          '**/*cyrillic*',
          '**/*greek*',
          '**/*vietnamese*',
          '**/*italic*',
          '**/*opsz*',
          '**/*standard*',
        ],
        navigateFallback: '/index.html',
        navigateFallbackDenylist: [/^\/api\//],
        cleanupOutdatedCaches: true,
        runtimeCaching: [
          {
            // API reads a grower needs in the field, kept for reading without signal (newest from
            // the network first). A RegExp, not a function: functions are copied into the worker
            // without the variables around them.
            urlPattern:
              /\/api\/(auth\/me|sites\/mine|sites\/[0-9a-f-]{36}(\/(strips|layout|photos|report))?)(\?.*)?$/,
            handler: 'NetworkFirst',
            options: {
              cacheName: 'sheaf-api',
              networkTimeoutSeconds: 6,
              cacheableResponse: { statuses: [200] },
              expiration: { maxEntries: 200, maxAgeSeconds: 60 * 60 * 24 * 60 },
            },
          },
          {
            urlPattern: ({ url, sameOrigin }) => sameOrigin && url.pathname.startsWith('/assets/'),
            handler: 'CacheFirst',
            options: { cacheName: 'sheaf-assets', expiration: { maxEntries: 60 } },
          },
        ],
      },
    }),
    precompress(),
  ],
  build: {
    outDir: 'dist/web',
    emptyOutDir: true,
    sourcemap: true,
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
