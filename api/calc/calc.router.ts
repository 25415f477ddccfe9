// Public calculators: seeding-rate conversions and seeder calibration (no sign-in needed).
import { Router } from 'express';
import { CalibrationCalcInputSchema, SeedingCalcInputSchema } from '../../shared/schemas/calc';
import { calculateSeeding } from '../../shared/design/seeding-calc';
import { calibrateSeeder } from '../../shared/units/calibration';
import { secureRouter } from '../lib/route-table';
import type { RouterContext } from '../lib/router-context';

export function createCalcRouter(ctx: RouterContext) {
  const router = Router();
  const routes = secureRouter(router, ctx.table, '/api');

  routes.post('/calc/seeding', ctx.policies.public, (req, res) => {
    res.json(calculateSeeding(SeedingCalcInputSchema.parse(req.body)));
  });

  routes.post('/calc/calibration', ctx.policies.public, (req, res) => {
    const input = CalibrationCalcInputSchema.parse(req.body);
    const result = calibrateSeeder({
      seedsCounted: input.seedsCounted,
      wheelTurns: input.wheelTurns,
      circumferenceFeet: input.wheelCircumferenceFt,
      rowSpacingInches: input.rowSpacingIn,
      targetSeedsPerFootOfRow: input.targetSeedsPerFootOfRow,
    });
    res.json({ ...result, targetSeedsForRun: result.targetSeedsPerTurn * input.wheelTurns });
  });

  return router;
}
