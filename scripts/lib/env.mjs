// Settings shared by the start, test and db scripts.
import crypto from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { spawn, spawnSync } from 'node:child_process';

export const DATA_DIR = path.resolve('.data');

/** A session secret kept in .data so sessions survive restarts of npm start. */
export function sessionSecret() {
  if (process.env.SESSION_SECRET) return process.env.SESSION_SECRET;
  const file = path.join(DATA_DIR, 'session-secret');
  fs.mkdirSync(DATA_DIR, { recursive: true });
  if (!fs.existsSync(file))
    fs.writeFileSync(file, crypto.randomBytes(32).toString('hex'), { mode: 0o600 });
  return fs.readFileSync(file, 'utf8').trim();
}

/** Runs a node script with tsx in this process's environment plus extra; throws on failure. */
export function runTs(script, args, env) {
  const result = spawnSync(process.execPath, ['--import', 'tsx', script, ...args], {
    stdio: 'inherit',
    env: { ...process.env, ...env },
  });
  if (result.status !== 0) throw new Error(`${script} ${args.join(' ')} failed`);
}

/** Builds the web app into outDir (default dist/web); WEB_DIST_DIR lets parallel runs use their own folder. */
export function buildWeb(outDir = process.env.WEB_DIST_DIR ?? 'dist/web') {
  if (process.env.SKIP_BUILD) return outDir;
  console.log('[sheaf] building the web app…');
  const result = spawnSync(
    process.execPath,
    [
      'node_modules/vite/bin/vite.js',
      'build',
      '--logLevel',
      'warn',
      '--outDir',
      outDir,
      '--emptyOutDir',
    ],
    { stdio: 'inherit' },
  );
  if (result.status !== 0) throw new Error('vite build failed');
  return outDir;
}

/** The web app build as an async step, so `npm test` can run it beside the static checks. */
export async function buildWebAlongside(outDir = process.env.WEB_DIST_DIR ?? 'dist/web') {
  if (process.env.SKIP_BUILD) return outDir;
  const result = await runQuietly('building the web app', process.execPath, [
    'node_modules/vite/bin/vite.js',
    'build',
    '--logLevel',
    'warn',
    '--outDir',
    outDir,
    '--emptyOutDir',
  ]);
  if (result.code !== 0) throw new Error('vite build failed');
  return outDir;
}

/**
 * Runs a child with its output held back and printed in one piece when it ends, so steps run
 * side by side do not interleave their lines; resolves with the exit code and the seconds taken.
 */
export function runQuietly(name, cmd, args, env = {}) {
  console.log(`[sheaf] ${name}…`);
  const started = Date.now();
  return new Promise((resolve) => {
    const child = spawn(cmd, args, {
      stdio: ['ignore', 'pipe', 'pipe'],
      env: { ...process.env, FORCE_COLOR: '1', ...env },
    });
    runningChildren.add(child);
    const chunks = [];
    child.stdout.on('data', (chunk) => chunks.push(chunk));
    child.stderr.on('data', (chunk) => chunks.push(chunk));
    child.on('close', (code, signal) => {
      runningChildren.delete(child);
      const output = Buffer.concat(chunks).toString();
      if (output.trim()) process.stdout.write(output.endsWith('\n') ? output : `${output}\n`);
      const seconds = ((Date.now() - started) / 1000).toFixed(1);
      const exit = code ?? (signal ? 1 : 0);
      console.log(`[sheaf] ${name}: ${exit === 0 ? 'ok' : 'FAILED'} (${seconds} s)`);
      resolve({ code: exit, seconds });
    });
  });
}

/** Children started by runChild that are still running, so a stopping script can end them. */
export const runningChildren = new Set();

/** Spawns a child and resolves with its exit code. */
export function runChild(cmd, args, env) {
  return new Promise((resolve) => {
    const child = spawn(cmd, args, { stdio: 'inherit', env: { ...process.env, ...env } });
    runningChildren.add(child);
    child.on('exit', (code, signal) => {
      runningChildren.delete(child);
      resolve(code ?? (signal ? 1 : 0));
    });
  });
}

/**
 * Calls stop() when this script loses its parent: npm runs scripts under `sh -c`, and a
 * SIGTERM sent to npm alone does not reach them.
 */
export function stopWhenOrphaned(stop) {
  const parentAtStart = process.ppid;
  setInterval(() => {
    if (process.ppid !== parentAtStart) stop();
  }, 500).unref();
}
