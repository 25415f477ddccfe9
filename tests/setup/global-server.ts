// Vitest global setup: one mail catcher process and one two-worker API server for the whole run,
// shared by every API and browser test file (each builds its own network, so files do not share
// data). At the end it fails the run if the server printed pg's overlapping-query warning.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import type { TestProject } from 'vitest/node';
import {
  OVERLAPPING_QUERY_WARNING,
  freePort,
  serverEnv,
  startApiServer,
  startCatcherProcess,
} from '../helpers/spawn-server';

declare module 'vitest' {
  export interface ProvidedContext {
    sheafServer: {
      url: string;
      catcherUrl: string;
      smtpPort: number;
      env: Record<string, string>;
    } | null;
    /** A folder where browser test files mark the kinds of page axe-core has checked this run. */
    axeChecked: string;
  }
}

export default async function setup(project: TestProject) {
  const axeChecked = fs.mkdtempSync(path.join(os.tmpdir(), 'sheaf-axe-'));
  project.provide('axeChecked', axeChecked);
  const removeAxeChecked = () => fs.rmSync(axeChecked, { recursive: true, force: true });
  const databaseUrl = process.env.DATABASE_URL;
  if (!databaseUrl) {
    // Pure unit tests run without `npm test`: no database, no server.
    project.provide('sheafServer', null);
    return removeAxeChecked;
  }
  const catcher = await startCatcherProcess();
  const port = await freePort();
  const env = serverEnv({ databaseUrl, catcher, port });
  const server = await startApiServer(env);
  project.provide('sheafServer', {
    url: `http://127.0.0.1:${port}`,
    catcherUrl: catcher.url,
    smtpPort: catcher.smtpPort,
    env,
  });
  return async () => {
    removeAxeChecked();
    await server.stop();
    await catcher.stop();
    const warning = server
      .output()
      .split('\n')
      .find((line) => OVERLAPPING_QUERY_WARNING.test(line));
    if (warning)
      throw new Error(`The API server ran overlapping queries on one connection: ${warning}`);
  };
}
