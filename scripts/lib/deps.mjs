// Installs npm dependencies and Debian packages that the two README commands need.
import { spawnSync } from 'node:child_process';
import fs from 'node:fs';

const isRoot = typeof process.getuid === 'function' && process.getuid() === 0;

export function ensureNodeModules() {
  const marker = 'node_modules/.package-lock.json';
  const stale =
    !fs.existsSync(marker) ||
    fs.statSync('package-lock.json').mtimeMs > fs.statSync(marker).mtimeMs + 1000;
  if (!stale) return;
  console.log('[sheaf] installing npm dependencies (npm ci)…');
  const result = spawnSync('npm', ['ci', '--no-audit', '--no-fund'], { stdio: 'inherit' });
  if (result.status !== 0) {
    console.error('[sheaf] npm ci failed');
    process.exit(1);
  }
}

/** Installs a Debian package when its binary is missing (only possible as root). */
export function ensureDebianPackage(binary, pkg) {
  if (fs.existsSync(binary)) return true;
  if (!isRoot) {
    console.error(
      `[sheaf] ${binary} is missing: run \`sudo apt-get install -y ${pkg}\` and try again.`,
    );
    return false;
  }
  console.log(`[sheaf] installing Debian package ${pkg}…`);
  const env = { ...process.env, DEBIAN_FRONTEND: 'noninteractive' };
  let result = spawnSync('apt-get', ['install', '-y', '-qq', pkg], { stdio: 'inherit', env });
  if (result.status !== 0) {
    spawnSync('apt-get', ['update', '-qq'], { stdio: 'inherit', env });
    result = spawnSync('apt-get', ['install', '-y', '-qq', pkg], { stdio: 'inherit', env });
  }
  return result.status === 0 && fs.existsSync(binary);
}
