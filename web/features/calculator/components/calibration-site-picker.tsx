// For a signed-in grower: which of their sites the check is for, and which of its rates is being
// set (which fills in the target seeds per foot or metre of row).
import { useMemo } from 'react';
import { packetUnits } from '../../../../shared/design/packet-numbers';
import { rateTable } from '../../../../shared/design/rate-table';
import { rateLevelShort } from '../../../../shared/labels/labels';
import type { SiteDetail } from '../../../../shared/schemas/site';
import { SelectField } from '../../../components/ui/form-fields';
import { useMySites } from '../../../lib/queries/sites';

const f1 = new Intl.NumberFormat('en', { maximumFractionDigits: 1 });

export function CalibrationSitePicker({
  site,
  siteId,
  onSite,
  rateLabel,
  onRate,
}: {
  site: SiteDetail | null;
  siteId: string | null;
  onSite: (siteId: string | null) => void;
  rateLabel: string;
  onRate: (label: string, seedsPerFootOfRow: number | null) => void;
}) {
  const mySites = useMySites();
  const targets = useMemo(
    () => (site ? rateTable({ ...site.trial, rateLevels: site.trial.rateLevels }) : []),
    [site],
  );
  const units = packetUnits(site?.trial.unitSystem ?? 'imperial');
  const growerSites = mySites.data ?? [];
  if (growerSites.length === 0) return null;
  return (
    <div className="grid gap-3 rounded-card border border-line bg-surface p-4 sm:grid-cols-2">
      <SelectField
        label="Your site"
        value={siteId ?? ''}
        onChange={(e) => onSite(e.target.value || null)}
      >
        <option value="">No site (just calculate)</option>
        {growerSites.map((s) => (
          <option key={s.id} value={s.id}>
            {s.fieldName} — {s.trialName}
          </option>
        ))}
      </SelectField>
      {targets.length > 0 ? (
        <SelectField
          label="Rate you are setting"
          value={rateLabel}
          onChange={(e) => {
            const row = targets.find((r) => r.label === e.target.value);
            onRate(e.target.value, row ? row.seedsPerFootOfRow : null);
          }}
        >
          <option value="">Choose a rate…</option>
          {targets.map((r) => (
            <option key={r.label} value={r.label}>
              {`${rateLevelShort(r)} — ${f1.format(units.perRowLength(r.seedsPerFootOfRow))} seeds/${units.length}`}
            </option>
          ))}
        </SelectField>
      ) : null}
    </div>
  );
}
