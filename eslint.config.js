// ESLint flat config: TypeScript rules, React hooks, TanStack Query, and the architecture as
// rules: import zones between folders and features, no import cycles, kebab-case file names.
import fs from 'node:fs';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import js from '@eslint/js';
import tseslint from 'typescript-eslint';
import reactHooks from 'eslint-plugin-react-hooks';
import pluginQuery from '@tanstack/eslint-plugin-query';
import importX, { createNodeResolver } from 'eslint-plugin-import-x';
import checkFile from 'eslint-plugin-check-file';
import globals from 'globals';

const root = path.dirname(fileURLToPath(import.meta.url));
const folders = (dir) =>
  fs
    .readdirSync(path.join(root, dir), { withFileTypes: true })
    .filter((entry) => entry.isDirectory())
    .map((entry) => entry.name);

// Places in api/ that every feature may import; every other folder in api/ is a feature.
// api/audit is shared on purpose: every feature that changes data writes its audit event.
const API_SHARED = ['lib', 'middleware', 'config', 'mail', 'audit', 'errors.ts'];
const API_FEATURES = folders('api').filter((name) => !API_SHARED.includes(name));
const WEB_FEATURES = folders('web/features');

// Feature-to-feature imports that are allowed on purpose, file by file, each with its reason.
// Keep this list short: the usual fix is to move the shared piece to api/lib or to pass a
// service in through the router context.
const FEATURE_IMPORT_EXCEPTIONS = {
  // The trial page enrols a site and sends every site's field packet: the trial routes call
  // the services that own those writes instead of repeating them.
  'api/trials/trials.router.ts': ['sites/sites.service.ts', 'packets/packets.service.ts'],
  // A site's own page resends its field packet through the packet service.
  'api/sites/sites.router.ts': ['packets/packets.service.ts'],
  // Type only: the trial service receives the invitations service to invite a new grower.
  'api/trials/trials.service.ts': ['invitations/invitations.service.ts'],
  // Type only: accepting an invitation signs the new account in through the auth service.
  'api/invitations/invitations.router.ts': ['auth/auth.service.ts'],
  // The demo's closed trial is published after the seed through the report service itself.
  'api/cli/publish-demo.ts': ['reports/reports.service.ts'],
  // The series report derives each strip's yield exactly as the pooled report does.
  'api/series/series.service.ts': ['reports/reports.presenter.ts'],
};

const apiFeatureZones = (exceptions = []) =>
  API_FEATURES.map((feature) => ({
    target: `./api/${feature}`,
    from: './api',
    except: [`./${feature}`, ...API_SHARED.map((place) => `./${place}`), ...exceptions],
    message: `api/${feature}/ imports only its own folder and the shared places (${API_SHARED.join(', ')}); see DEVELOPERS.md.`,
  }));

const webFeatureZones = WEB_FEATURES.map((feature) => ({
  target: `./web/features/${feature}`,
  from: './web/features',
  except: [`./${feature}`],
  message: `web/features/${feature}/ imports no other feature: move shared code to web/components or web/lib.`,
}));

// web/ flows one way: app (routes) → features → components and lib.
const webLayerZones = [
  {
    target: ['./web/features', './web/components', './web/lib'],
    from: './web/app',
    message: 'Only web/app (the routes) composes features into pages; nothing imports web/app.',
  },
  {
    target: ['./web/components', './web/lib'],
    from: './web/features',
    message: 'web/components and web/lib are shared by every feature and import none.',
  },
];

const layerZones = [
  {
    target: './web',
    from: ['./api', './db'],
    message:
      'web/ never imports api/ or db/: talk to the API over HTTP through web/lib/api-client.',
  },
  {
    target: './shared',
    from: '.',
    except: ['./shared', './node_modules'],
    message: 'shared/ imports nothing outside shared/ (it runs in the browser and the API).',
  },
  {
    target: './db',
    from: ['./api', './web'],
    message: 'db/ never imports api/ or web/.',
  },
];

const zonesRule = (exceptions = []) => [
  'error',
  {
    zones: [...layerZones, ...webLayerZones, ...apiFeatureZones(exceptions), ...webFeatureZones],
  },
];

// Globals that only exist in Node or only in a browser: shared/ must use neither.
const NODE_ONLY_GLOBALS = [
  'process',
  'Buffer',
  'require',
  'module',
  '__dirname',
  '__filename',
  'global',
  'setImmediate',
];
const DOM_ONLY_GLOBALS = [
  'window',
  'document',
  'navigator',
  'localStorage',
  'sessionStorage',
  'location',
  'history',
  'indexedDB',
  'HTMLElement',
  'Element',
  'Node',
  'Event',
  'fetch',
  'XMLHttpRequest',
  'alert',
  'self',
];

export default tseslint.config(
  {
    ignores: ['dist/**', 'node_modules/**', '.data/**', '.test-artifacts/**', 'coverage/**'],
  },
  { linterOptions: { reportUnusedDisableDirectives: 'error' } },
  js.configs.recommended,
  ...tseslint.configs.recommended,
  {
    languageOptions: { globals: { ...globals.node, ...globals.browser } },
    rules: {
      '@typescript-eslint/no-unused-vars': [
        'error',
        { argsIgnorePattern: '^_', varsIgnorePattern: '^_' },
      ],
      '@typescript-eslint/no-non-null-assertion': 'off',
    },
  },
  {
    files: ['**/*.{ts,tsx,js,mjs}'],
    plugins: { 'import-x': importX, 'check-file': checkFile },
    settings: {
      'import-x/resolver-next': [
        createNodeResolver({ extensions: ['.ts', '.tsx', '.js', '.mjs', '.json', '.d.ts'] }),
      ],
      'import-x/extensions': ['.ts', '.tsx', '.js', '.mjs'],
    },
    rules: {
      'import-x/no-cycle': ['error', { ignoreExternal: true }],
      'import-x/no-restricted-paths': zonesRule(),
      'check-file/filename-naming-convention': [
        'error',
        { '**/*.{ts,tsx,js,mjs,cjs}': 'KEBAB_CASE' },
        { ignoreMiddleExtensions: true },
      ],
      'check-file/folder-naming-convention': [
        'error',
        { '{api,db,shared,web,tests,scripts,fixtures}/**/': 'KEBAB_CASE' },
      ],
    },
  },
  {
    // Migrations start with their timestamp: <digits>-<kebab-case-what>.ts.
    files: ['db/migrations/*.ts'],
    rules: {
      'check-file/filename-naming-convention': [
        'error',
        { '**/*.ts': '+([0-9])-+([a-z0-9])*(-+([a-z0-9]))' },
      ],
    },
  },
  ...Object.entries(FEATURE_IMPORT_EXCEPTIONS).map(([file, allowed]) => ({
    files: [file],
    rules: { 'import-x/no-restricted-paths': zonesRule(allowed.map((p) => `./${p}`)) },
  })),
  {
    files: ['web/**/*.{ts,tsx}'],
    plugins: { 'react-hooks': reactHooks, '@tanstack/query': pluginQuery },
    rules: {
      'react-hooks/rules-of-hooks': 'error',
      'react-hooks/exhaustive-deps': 'warn',
      ...pluginQuery.configs.recommended.rules,
    },
  },
  {
    // Components stay small: a component or hook over 150 lines is split (house style), in
    // every file of web/ and with no folder left out.
    files: ['web/**/*.{ts,tsx}'],
    rules: {
      'max-lines-per-function': ['error', { max: 150, skipBlankLines: true, skipComments: true }],
    },
  },
  {
    files: ['shared/**/*.ts'],
    languageOptions: { globals: { ...globals.es2022 } },
    rules: {
      'import-x/no-nodejs-modules': 'error',
      'no-restricted-imports': [
        'error',
        {
          patterns: [
            {
              group: [
                'node:*',
                'react',
                'react-dom',
                'react-dom/*',
                'react-router*',
                '@tanstack/*',
                'express',
                'express-*',
                'pg',
                'pg-*',
                'typeorm',
                'typeorm/*',
                'vega*',
                'playwright-core',
                'nodemailer',
                'multer',
                'passport*',
              ],
              message:
                'shared/ runs in the browser and the API: no Node, DOM, React, Express, PostgreSQL or TypeORM imports.',
            },
          ],
        },
      ],
      'no-restricted-globals': [
        'error',
        ...NODE_ONLY_GLOBALS.map((name) => ({
          name,
          message: 'shared/ runs in the browser too: no Node globals.',
        })),
        ...DOM_ONLY_GLOBALS.map((name) => ({
          name,
          message: 'shared/ runs in the API too: no DOM globals.',
        })),
      ],
    },
  },
);
