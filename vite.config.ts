// Vite build for the Sheaf web app: React, Tailwind (theme from tailwind.config.ts), the offline
// app (web app manifest and a Workbox service worker), brotli and gzip copies of text assets,
// the list of chunks each page needs (for the server's modulepreload hints), and the /api proxy in dev.
import fs from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import zlib from 'node:zlib';
import tailwindcss from '@tailwindcss/vite';
import react from '@vitejs/plugin-react';
import type * as TS from 'typescript';
import { defineConfig, type Plugin, type Rollup } from 'vite';
import { VitePWA } from 'vite-plugin-pwa';

/** Charting libraries are large and only report pages need them: keep them in their own chunk. */
const chartModules = /[\\/]node_modules[\\/](vega|vega-[^\\/]+|vega-lite|d3-[^\\/]+)[\\/]/;

/**
 * The first start-up stage, loaded with the entry (web/main.tsx): React, Vite's helper for
 * preloading a chunk's imports, and the web font's loader (the entry uses both, so they must not
 * land in a later stage's file: the entry would then run that whole stage in its own task).
 */
const reactModules =
  /[\\/]node_modules[\\/](react|react-dom|scheduler)[\\/]|preload-helper|[\\/]web[\\/]lib[\\/]web-font\.ts$/;

/** The second and third stages: zod with Sheaf's settings for it, and React Router. */
const zodModules = /[\\/]node_modules[\\/]zod[\\/]|[\\/]web[\\/]lib[\\/]zod-setup\.ts$/;
const routerModules =
  /[\\/]node_modules[\\/]react-router[\\/]|[\\/]web[\\/]app[\\/]router-library\.ts$/;

/** The last stage: the app's start module (and so what it imports: queries, schemas, the shell). */
const appModules = /[\\/]web[\\/]app[\\/]start\.tsx$/;

/**
 * The grower's site page is the page opened in the field on a phone's slow link. What it needs
 * beyond the start-up files comes in few files: `site-page`, the modules only signed-in pages use,
 * and `site-page-shared`, the ones the signed-out pages (cautions, calculator…) use as well, so a
 * signed-out visitor never downloads the grower's code. The sign-in page's modules stay as the
 * bundler splits them: it is everyone's first page and downloads nothing it does not need (with
 * them in `site-page-shared` its largest paint came ~0.15 s later). Left to the bundler the page
 * came as 13 files of 0.5–5 kB, and on HTTP/1.1 each small file costs a round trip on one of the six
 * connections: in Lighthouse's slow-4G simulation the page's largest paint came 0.2–0.3 s later.
 * Other signed-in pages that use a piece of the site page load its file too (it then costs
 * nothing when they open a site).
 */
const SITE_PAGE_PATH = '/sites/:siteId';
const SIGN_IN_PATH = '/sign-in';
/** The app shell's layout route: pages outside it are the ones a signed-out visitor can open. */
const APP_LAYOUT_MODULE = 'web/app/routes/app/layout';

type ModuleGraph = { getModuleInfo(id: string): { importedIds: readonly string[] } | null };

/** Everything reachable from `start` by following `next`, the start included. */
function reachable(
  start: string[],
  next: (item: string) => readonly string[] | undefined,
): Set<string> {
  const seen = new Set<string>();
  const stack = [...start];
  while (stack.length > 0) {
    const item = stack.pop()!;
    if (seen.has(item)) continue;
    seen.add(item);
    stack.push(...(next(item) ?? []));
  }
  return seen;
}

/** The modules `roots` import statically, directly or through others, the roots included. */
const staticImports = (graph: ModuleGraph, roots: string[]) =>
  reachable(roots, (id) => graph.getModuleInfo(id)?.importedIds);

/** A route module's id (its file), from the extension-less path of its import in the route table. */
const moduleFile = (module: string) =>
  ['.tsx', '.ts'].map((extension) => module + extension).find((file) => fs.existsSync(file)) ??
  module;

/**
 * The chunk name for a module of the site page (see above), null for every other module. Reads the
 * route table of `routerFile` to find the site page's route modules and the signed-out pages'.
 */
function sitePageChunks(routerFile: string): (id: string, graph: ModuleGraph) => string | null {
  let names: Map<string, 'site-page' | 'site-page-shared'> | null = null;
  return (id, graph) => {
    if (!names) {
      const ts = createRequire(import.meta.url)('typescript') as typeof TS;
      const leaves = readRouteTable(ts, path.resolve(routerFile));
      const appLayout = path.resolve(APP_LAYOUT_MODULE);
      const leafModules = (page: string) => {
        const leaf = leaves.find((candidate) => candidate.path === page);
        if (!leaf) throw new Error(`${routerFile} has no ${page} page`);
        return leaf.modules.map(moduleFile);
      };
      const signedOut = staticImports(
        graph,
        leaves
          .filter((leaf) => !leaf.modules.includes(appLayout))
          .flatMap((leaf) => leaf.modules.map(moduleFile)),
      );
      const signIn = staticImports(graph, leafModules(SIGN_IN_PATH));
      names = new Map();
      for (const module of staticImports(graph, leafModules(SITE_PAGE_PATH))) {
        if (!signedOut.has(module)) names.set(module, 'site-page');
        // A package's index module names all its parts, used or not: only Sheaf's own modules.
        else if (!signIn.has(module) && !/[\\/]node_modules[\\/]/.test(module))
          names.set(module, 'site-page-shared');
      }
    }
    return names.get(id) ?? null;
  };
}

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

// ---- Which code each page's first visit needs -------------------------------------------------
// The route table in web/app/router.tsx (paths and their lazily imported route modules) is read at
// build time; each route module's chunk and the chunks it imports are written to
// `.vite/route-preloads.json`: [{ "path": "/sites/:siteId", "files": ["assets/site-x.js", …] }, …].
// The server (api/lib/web-shell.ts) lists those files as <link rel="modulepreload"> in the page it
// sends for a URL, so the page's own code downloads with the entry code instead of one round trip
// after the entry has run. The build's dot-folder is never served.

const ROUTE_PRELOADS_FILE = '.vite/route-preloads.json';

interface RouteNode {
  path?: string;
  index?: boolean;
  module?: string;
  children: RouteNode[];
}

/** Leaf routes of the table: their full path and the modules (layouts, then page) they load. */
interface RouteLeaf {
  path: string;
  modules: string[];
}

/** Reads the route tree exported as `routes` from a router file such as web/app/router.tsx. */
function readRouteTable(ts: typeof TS, file: string): RouteLeaf[] {
  const source = ts.createSourceFile(file, fs.readFileSync(file, 'utf8'), ts.ScriptTarget.Latest);
  const arrays = new Map<string, TS.ArrayLiteralExpression>();
  for (const statement of source.statements) {
    if (!ts.isVariableStatement(statement)) continue;
    for (const declaration of statement.declarationList.declarations) {
      if (ts.isIdentifier(declaration.name) && declaration.initializer) {
        const init = declaration.initializer;
        if (ts.isArrayLiteralExpression(init)) arrays.set(declaration.name.text, init);
      }
    }
  }
  const importOf = (node: TS.Node): string | undefined => {
    let found: string | undefined;
    const visit = (n: TS.Node) => {
      if (
        ts.isCallExpression(n) &&
        n.expression.kind === ts.SyntaxKind.ImportKeyword &&
        n.arguments[0] &&
        ts.isStringLiteral(n.arguments[0])
      )
        found = path.resolve(path.dirname(file), n.arguments[0].text);
      else ts.forEachChild(n, visit);
    };
    visit(node);
    return found;
  };
  const readArray = (array: TS.ArrayLiteralExpression): RouteNode[] =>
    array.elements.filter(ts.isObjectLiteralExpression).map((object) => {
      const node: RouteNode = { children: [] };
      for (const property of object.properties) {
        if (!ts.isPropertyAssignment(property) || !ts.isIdentifier(property.name)) continue;
        const value = property.initializer;
        switch (property.name.text) {
          case 'path':
            if (ts.isStringLiteral(value)) node.path = value.text;
            break;
          case 'index':
            node.index = value.kind === ts.SyntaxKind.TrueKeyword;
            break;
          case 'lazy':
            node.module = importOf(value);
            break;
          case 'children':
            if (ts.isArrayLiteralExpression(value)) node.children = readArray(value);
            else if (ts.isIdentifier(value) && arrays.has(value.text))
              node.children = readArray(arrays.get(value.text)!);
            break;
        }
      }
      return node;
    });
  const root = arrays.get('routes');
  if (!root) throw new Error(`${file} has no \`routes\` array`);
  const leaves: RouteLeaf[] = [];
  const walk = (nodes: RouteNode[], parentPath: string, parentModules: string[]) => {
    for (const node of nodes) {
      const full = node.path
        ? `${parentPath.replace(/\/$/, '')}/${node.path}`.replace(/\/+/g, '/')
        : parentPath;
      const modules = node.module ? [...parentModules, node.module] : parentModules;
      if (node.children.length > 0) walk(node.children, full, modules);
      else if (node.index || node.path) leaves.push({ path: full || '/', modules });
    }
  };
  walk(readArray(root), '/', []);
  return leaves;
}

type OutputBundle = Rollup.OutputBundle;
type OutputChunk = Rollup.OutputChunk;

/** Every chunk file reachable from `start` through static imports. */
const staticClosure = (byFile: Map<string, OutputChunk>, start: string[]) =>
  reachable(start, (file) => byFile.get(file)?.imports);

/**
 * The files every page runs at start: the entry, and the stages web/main.tsx imports itself (React,
 * then the app with its router). The pages' own chunks are imported by the router, not the entry.
 */
function startupFiles(bundle: OutputBundle): Set<string> {
  const chunks = Object.values(bundle).filter((item) => item.type === 'chunk');
  const byFile = new Map(chunks.map((chunk) => [chunk.fileName, chunk]));
  const entries = chunks.filter((chunk) => chunk.isEntry);
  return staticClosure(byFile, [
    ...entries.map((chunk) => chunk.fileName),
    ...entries.flatMap((chunk) => chunk.dynamicImports),
  ]);
}

/**
 * Adds a <link rel="modulepreload"> to index.html for each start-up file the entry imports as a
 * later stage, so they download with the entry rather than one round trip after it has run.
 */
function startupPreloads(): Plugin {
  return {
    name: 'sheaf-startup-preloads',
    apply: 'build',
    transformIndexHtml: {
      order: 'post',
      handler(_html, context) {
        if (!context.bundle) return [];
        const chunks = Object.values(context.bundle).filter((item) => item.type === 'chunk');
        // Vite itself preloads what the entry imports statically.
        const preloaded = staticClosure(
          new Map(chunks.map((chunk) => [chunk.fileName, chunk])),
          chunks.filter((chunk) => chunk.isEntry).map((chunk) => chunk.fileName),
        );
        return [...startupFiles(context.bundle)]
          .filter((file) => !preloaded.has(file))
          .sort()
          .map((file) => ({
            tag: 'link',
            attrs: { rel: 'modulepreload', crossorigin: true, href: `/${file}` },
            injectTo: 'head' as const,
          }));
      },
    },
  };
}

/** The plugin: writes ROUTE_PRELOADS_FILE for the route table in `routerFile`. */
function routePreloads(routerFile: string): Plugin {
  return {
    name: 'sheaf-route-preloads',
    apply: 'build',
    async generateBundle(_options, bundle) {
      const { default: ts } = await import('typescript');
      const chunks = Object.values(bundle).filter((item) => item.type === 'chunk');
      const byFile = new Map(chunks.map((chunk) => [chunk.fileName, chunk]));
      const byModule = new Map<string, string>();
      const moduleKey = (id: string) => id.replace(/\.[cm]?[jt]sx?$/, '');
      // A route module is the face of its own chunk, or one of the modules of a group's chunk.
      for (const chunk of chunks)
        for (const id of chunk.moduleIds) byModule.set(moduleKey(id), chunk.fileName);
      for (const chunk of chunks)
        if (chunk.facadeModuleId) byModule.set(moduleKey(chunk.facadeModuleId), chunk.fileName);
      const closure = (start: string[]) => staticClosure(byFile, start);
      // The start-up files are in index.html already.
      const inShell = startupFiles(bundle);
      const table = readRouteTable(ts, path.resolve(routerFile)).map((leaf) => {
        const own = leaf.modules.map((module) => byModule.get(moduleKey(module)));
        if (own.some((file) => !file))
          this.error(`route ${leaf.path}: a route module has no chunk of its own`);
        const files = [...closure(own as string[])].filter((file) => !inShell.has(file));
        return { path: leaf.path, files: files.sort() };
      });
      this.emitFile({
        type: 'asset',
        fileName: ROUTE_PRELOADS_FILE,
        source: `${JSON.stringify(table, null, 1)}\n`,
      });
    },
  };
}

export default defineConfig({
  root: '.',
  resolve: {
    // React Router's package exports only its development build (the same code with its dev-only
    // warnings switched on); the app takes the production copy the package ships beside it.
    alias: [
      {
        find: /^react-router$/,
        replacement: path.resolve('node_modules/react-router/dist/production/index.mjs'),
      },
      {
        find: /^react-router\/dom$/,
        replacement: path.resolve('node_modules/react-router/dist/production/dom-export.mjs'),
      },
    ],
  },
  plugins: [
    react(),
    tailwindcss(),
    VitePWA({
      registerType: 'autoUpdate',
      // The app's entry registers the worker at the window's load event (web/main.tsx), rather
      // than a script file of its own: one request less on a first visit. Registering later, once
      // the first page had shown, measured worse: the worker's install then competed with the
      // page's last tasks.
      injectRegister: false,
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
    startupPreloads(),
    routePreloads('web/app/router.tsx'),
    precompress(),
  ],
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
          groups: [
            { name: 'vega', test: chartModules, priority: 3 },
            // The start-up stages of web/main.tsx in one file each rather than many: on a phone's
            // HTTP/1.1 connection (six at a time) the page's own code then does not queue behind
            // them. React first, then zod, React Router, and the app's start (queries, schemas,
            // shell), each run in a task of its own.
            { name: 'react', test: reactModules, priority: 3 },
            { name: 'zod', test: zodModules, priority: 3 },
            { name: 'router', test: routerModules, priority: 3 },
            // The app's start module takes the modules it imports into its group with it.
            { name: 'app', test: appModules, priority: 2 },
            // Only the modules named, not what they import: the start-up files' modules are taken
            // by the groups above, and a module of the signed-out pages must not be pulled into
            // `site-page` as a dependency of one of its modules.
            {
              name: sitePageChunks('web/app/router.tsx'),
              debugName: 'site-page',
              priority: 1,
              includeDependenciesRecursively: false,
            },
          ],
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
