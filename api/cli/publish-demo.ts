// Publishes the invented demo's closed trials (site reports and the pooled report) after the
// seed, through the same report service the coordinator's "Publish" uses. Restart-safe.
import 'reflect-metadata';
import { IsNull } from 'typeorm';
import { createDataSource } from '../../db/data-source';
import { Network } from '../../db/entities/network.entity';
import { ReportSnapshot } from '../../db/entities/report-snapshot.entity';
import { Site } from '../../db/entities/site.entity';
import { Trial } from '../../db/entities/trial.entity';
import { createReportsService } from '../reports/reports.service';

async function main() {
  const url = process.env.DATABASE_URL;
  if (!url) throw new Error('DATABASE_URL is required');
  const dataSource = createDataSource(url, { poolSize: 2 });
  await dataSource.initialize();
  try {
    const network = await dataSource.getRepository(Network).findOne({ where: { isDemo: true } });
    if (!network) return;
    // No grower on these sites has an account, so nothing is mailed; a no-op mailer makes sure.
    const reports = createReportsService({
      dataSource,
      mailer: { send: async () => {} },
      publicUrl: '',
    });
    const trials = await dataSource
      .getRepository(Trial)
      .find({ where: { networkId: network.id, status: 'closed' } });
    for (const trial of trials) {
      if (!trial.createdBy) continue;
      const sites = await dataSource.getRepository(Site).find({
        where: { trialId: trial.id, publishedAt: IsNull() },
        order: { reportNumber: 'ASC' },
      });
      for (const site of sites) await reports.publishSite(site.id, trial.createdBy);
      const pooled = await dataSource
        .getRepository(ReportSnapshot)
        .exists({ where: { trialId: trial.id, scope: 'pooled', withdrawnAt: IsNull() } });
      if (!pooled) await reports.publishTrial(trial.id, trial.createdBy);
      if (sites.length > 0 || !pooled) console.log(`[sheaf] demo: published ${trial.name}`);
    }
  } finally {
    await dataSource.destroy();
  }
}

main().catch((error) => {
  console.error(`[sheaf] ${error instanceof Error ? error.message : error}`);
  process.exit(1);
});
