// Smaller leaks and holds: a client that trickles its headers or body in is cut off, and the
// production build ships no source maps.
import fs from 'node:fs';
import net from 'node:net';
import path from 'node:path';
import type { ChildProcess } from 'node:child_process';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import viteConfig from '../../../vite.config';
import { freePort, startServerProcess } from '../../helpers/server-process';

/** Opens a socket, writes `first`, then one more piece every 300 ms; resolves with what the server said and when. */
function trickle(port: number, first: string, piece: string) {
  return new Promise<{ reply: string; afterMs: number }>((resolve, reject) => {
    const started = Date.now();
    const socket = net.connect(port, '127.0.0.1', () => socket.write(first));
    let reply = '';
    const timer = setInterval(() => socket.writable && socket.write(piece), 300);
    const give = setTimeout(() => {
      clearInterval(timer);
      socket.destroy();
      reject(new Error('the server kept the slow client for 15 s'));
    }, 15_000);
    socket.on('data', (chunk) => (reply += chunk.toString()));
    socket.on('error', () => undefined);
    socket.on('close', () => {
      clearInterval(timer);
      clearTimeout(give);
      resolve({ reply, afterMs: Date.now() - started });
    });
  });
}

describe('slow clients', () => {
  let child: ChildProcess | null = null;
  let port = 0;
  beforeAll(async () => {
    port = await freePort();
    child = await startServerProcess(port, {
      HEADERS_TIMEOUT_MS: '1500',
      REQUEST_TIMEOUT_MS: '3000',
    });
  }, 90_000);
  afterAll(() => {
    child?.kill('SIGTERM');
  });

  it('cuts off a client that trickles its headers in', async () => {
    const { reply, afterMs } = await trickle(
      port,
      'GET /api/health HTTP/1.1\r\nHost: x\r\n',
      'X-Slow: 1\r\n',
    );
    expect(reply).toMatch(/^HTTP\/1\.1 408/);
    expect(afterMs).toBeLessThan(6_000);
  });

  it('cuts off a client that trickles its body in', async () => {
    const { reply, afterMs } = await trickle(
      port,
      'POST /api/calc/seeding HTTP/1.1\r\nHost: x\r\nContent-Type: application/json\r\nContent-Length: 100000\r\n\r\n{',
      ' ',
    );
    expect(reply).toMatch(/^HTTP\/1\.1 408/);
    expect(afterMs).toBeLessThan(8_000);
  });
});

describe('production build', () => {
  it('emits no source maps', () => {
    expect(viteConfig.build?.sourcemap).toBe(false);
    const assets = path.resolve('dist/web/assets');
    // When the web app was built for this run, look at the files too.
    if (fs.existsSync(assets) && !process.env.SKIP_BUILD) {
      const files = fs.readdirSync(assets);
      expect(files.filter((f) => f.endsWith('.map'))).toEqual([]);
      for (const file of files.filter((f) => f.endsWith('.js')))
        expect(fs.readFileSync(path.join(assets, file), 'utf8')).not.toContain('sourceMappingURL');
    }
  });
});
