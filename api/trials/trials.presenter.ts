// Trial rows → the shared Trial DTO (nulls become absent fields, numbers stay numbers).
import type { Trial as TrialDto, TrialSiteRow } from '../../shared/schemas/trial';
import type { RateLevelRow } from '../../db/entities/rate-level.entity';
import type { Trial } from '../../db/entities/trial.entity';

function present<T>(value: T | null): T | undefined {
  return value === null ? undefined : value;
}

export function presentTrial(
  trial: Trial,
  extra: {
    networkName: string;
    levels: RateLevelRow[];
    siteCount: number;
    pooledPublishedAt: Date | null;
  },
): TrialDto {
  return {
    id: trial.id,
    networkId: trial.networkId,
    networkName: extra.networkName,
    name: trial.name,
    question: trial.question,
    status: trial.status,
    crop: present(trial.crop),
    customCrop: trial.customCrop,
    season: present(trial.season),
    unitSystem: trial.unitSystem,
    referenceRate: present(trial.referenceRate),
    referenceUnit: present(trial.referenceUnit),
    rateLevels: [...extra.levels]
      .sort((a, b) => a.position - b.position)
      .map((l) => ({ id: l.id, multiplier: l.multiplier, label: l.label })),
    blocksPerSite: present(trial.blocksPerSite),
    rowsPerStrip: present(trial.rowsPerStrip),
    rowSpacingIn: present(trial.rowSpacingIn),
    stripLengthFt: present(trial.stripLengthFt),
    borderRows: present(trial.borderRows),
    thousandKernelWeightG: present(trial.thousandKernelWeightG),
    germinationPct: present(trial.germinationPct),
    emergencePct: present(trial.emergencePct),
    seedPricePerLb: present(trial.seedPricePerLb),
    grainPricePerBu: present(trial.grainPricePerBu),
    siteCount: extra.siteCount,
    pooledPublishedAt: extra.pooledPublishedAt
      ? new Date(extra.pooledPublishedAt).toISOString()
      : null,
    publicLinkToken: trial.publicLinkToken,
    createdAt: new Date(trial.createdAt).toISOString(),
    updatedAt: new Date(trial.updatedAt).toISOString(),
  };
}

export interface SiteRowQuery {
  id: string;
  field_name: string;
  grower_user_id: string | null;
  grower_name: string | null;
  grower_email: string | null;
  pending: boolean;
  randomized_at: Date | null;
  sowing_date: string | null;
  sowing_recorded: boolean;
  strip_count: string;
  published_at: Date | null;
}

export function presentSiteRow(r: SiteRowQuery): TrialSiteRow {
  return {
    id: r.id,
    fieldName: r.field_name,
    growerUserId: r.grower_user_id,
    growerName: r.grower_name,
    growerEmail: r.grower_email,
    invitationPending: r.pending,
    randomized: r.randomized_at !== null,
    randomizedAt: r.randomized_at ? new Date(r.randomized_at).toISOString() : null,
    sowingDate: r.sowing_date,
    sowingRecorded: r.sowing_recorded,
    stripCount: Number(r.strip_count),
    publishedAt: r.published_at ? new Date(r.published_at).toISOString() : null,
  };
}
