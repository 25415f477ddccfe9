// npm run audit: `npm audit --omit=dev --audit-level=high` where the registry answers advisory
// requests. Some registries and mirrors refuse them (HTTP 405 on the advisory endpoint); then
// this falls back to what a plain GET can tell: the registry's deprecation notice on every
// installed production package version (maintainers mark versions with known security holes
// deprecated). The fallback is weaker than an advisory check, and says so.
import { spawnSync } from 'node:child_process';
import { ensureNodeModules } from './lib/deps.mjs';

ensureNodeModules();
const audit = spawnSync('npm', ['audit', '--omit=dev', '--audit-level=high'], { encoding: 'utf8' });
const output = `${audit.stdout}${audit.stderr}`;
if (!/audit endpoint returned an error|405|ENOAUDIT|does not support audit/i.test(output)) {
  process.stdout.write(output);
  process.exit(audit.status ?? 1);
}

console.log('[audit] the registry refused the advisory request:');
console.log(
  `        ${
    output
      .split('\n')
      .find((line) => /405|error/i.test(line))
      ?.trim() ?? 'no reason given'
  }`,
);
console.log('[audit] falling back to deprecation notices of the installed production packages.');

const tree = JSON.parse(
  spawnSync('npm', ['ls', '--omit=dev', '--all', '--json'], {
    encoding: 'utf8',
    maxBuffer: 64 * 1024 * 1024,
  }).stdout,
);
const installed = new Map();
(function walk(dependencies) {
  for (const [name, dep] of Object.entries(dependencies ?? {})) {
    if (dep.version && !dep.extraneous)
      installed.set(`${name}@${dep.version}`, { name, version: dep.version });
    walk(dep.dependencies);
  }
})(tree.dependencies);

const registry = (
  spawnSync('npm', ['config', 'get', 'registry'], { encoding: 'utf8' }).stdout.trim() ||
  'https://registry.npmjs.org/'
).replace(/\/?$/, '/');

// A control: a version everyone knows is deprecated. From memory: the `request` package was
// deprecated as a whole in February 2020, so its last version carries the notice. A registry
// or mirror that drops deprecation notices would make every package look clean.
const canary = await fetch(`${registry}request/2.88.2`, { signal: AbortSignal.timeout(20_000) })
  .then((res) => (res.ok ? res.json() : {}))
  .catch(() => ({}));
if (!canary.deprecated) {
  console.log(
    '[audit] this registry does not carry deprecation notices either (request@2.88.2 shows none),',
  );
  console.log(
    '        so nothing can be checked from here. Run `npm audit --omit=dev` where the registry answers it.',
  );
  process.exit(2);
}
const deprecated = [];
const unreachable = [];
const queue = [...installed.values()];
async function worker() {
  for (let item = queue.shift(); item; item = queue.shift()) {
    const url = `${registry}${item.name.replace('/', '%2F')}/${item.version}`;
    try {
      const res = await fetch(url, {
        headers: { accept: 'application/json' },
        signal: AbortSignal.timeout(20_000),
      });
      if (!res.ok) throw new Error(`HTTP ${res.status}`);
      const meta = await res.json();
      if (meta.deprecated) deprecated.push(`${item.name}@${item.version}: ${meta.deprecated}`);
    } catch (error) {
      unreachable.push(`${item.name}@${item.version} (${error.message})`);
    }
  }
}
await Promise.all(Array.from({ length: 8 }, worker));

console.log(
  `[audit] ${installed.size} production package versions checked; ${deprecated.length} deprecated, ${unreachable.length} not answered.`,
);
for (const line of deprecated) console.log(`  deprecated: ${line}`);
for (const line of unreachable) console.log(`  not answered: ${line}`);
console.log(
  '[audit] run `npm audit --omit=dev` where the registry answers it for real advisory data.',
);
process.exit(deprecated.length > 0 || unreachable.length > 0 ? 1 : 0);
