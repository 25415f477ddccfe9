// Liveness and database reachability; answers quickly even when PostgreSQL is down.
import { Router } from 'express';
import type { DataSource } from 'typeorm';
import type { Policies } from '../middleware/access';
import { secureRouter, type RouteEntry } from '../lib/route-table';

async function databaseAnswers(dataSource: DataSource, timeoutMs: number): Promise<boolean> {
  let timer: NodeJS.Timeout | undefined;
  const timeout = new Promise<boolean>((resolve) => {
    timer = setTimeout(() => resolve(false), timeoutMs);
  });
  // Raw on purpose: a liveness probe asks PostgreSQL to answer, not about any table or entity.
  const query = dataSource.query('SELECT 1').then(
    () => true,
    () => false,
  );
  const ok = await Promise.race([query, timeout]);
  clearTimeout(timer);
  return ok;
}

export function createHealthRouter(deps: {
  dataSource: DataSource;
  policies: Policies;
  table: RouteEntry[];
}) {
  const router = Router();
  const routes = secureRouter(router, deps.table, '/api');
  routes.get('/health', deps.policies.public, async (_req, res) => {
    const ok = await databaseAnswers(deps.dataSource, 2500);
    res.status(ok ? 200 : 503).json({ status: ok ? 'ok' : 'degraded', db: ok ? 'ok' : 'down' });
  });
  return router;
}
