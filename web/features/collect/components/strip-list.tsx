// Every strip of a site by block and position, with what is recorded, what is missing and the yield.
import { Link } from 'react-router-dom';
import {
  MEASUREMENT_GROUPS,
  MEASUREMENT_GROUP_NAMES,
  type SiteStrips,
} from '../../../../shared/schemas/strip';
import { recordedGroups } from '../../../../shared/units/strip-derived';
import { cn } from '../../../lib/cn';
import { useOutbox } from '../lib/outbox';
import { effectiveValues, formatNumber, liveDerived } from '../lib/strip-values';

const SHORT: Record<(typeof MEASUREMENT_GROUPS)[number], string> = {
  stand: 'Stand',
  tillers: 'Tillers',
  heads: 'Heads',
  yield: 'Yield',
};

/**
 * Blocks built in the page's first render. The others follow in a render of their own a moment
 * later, so a slow phone shows the top of the list without first building every strip of the site.
 */
const FIRST_BLOCKS = 1;

/** `restShown`: whether the blocks after the first are built yet (the page decides when). */
export function StripList({ data, restShown }: { data: SiteStrips; restShown: boolean }) {
  const outbox = useOutbox();
  const metric = data.site.unitSystem === 'metric';
  const allBlocks = [...new Set(data.strips.map((s) => s.block))].sort((a, b) => a - b);
  const blocks = restShown ? allBlocks : allBlocks.slice(0, FIRST_BLOCKS);
  const totals = Object.fromEntries(
    MEASUREMENT_GROUPS.map((g) => [
      g,
      data.strips.filter(
        (s) =>
          recordedGroups(
            effectiveValues(
              s,
              outbox.find((e) => e.stripId === s.stripId),
            ),
          )[g],
      ).length,
    ]),
  );
  return (
    <div className="space-y-6">
      <dl className="grid grid-cols-2 gap-2 sm:grid-cols-4">
        {MEASUREMENT_GROUPS.map((group) => (
          <div key={group} className="rounded-field border border-line bg-surface px-3 py-2">
            <dt className="text-caption text-ink-muted">{MEASUREMENT_GROUP_NAMES[group]}</dt>
            <dd className="figures text-heading text-ink">
              {totals[group]}{' '}
              <span className="text-label font-normal text-ink-muted">of {data.strips.length}</span>
            </dd>
          </div>
        ))}
      </dl>
      {blocks.map((block) => (
        <section key={block} aria-labelledby={`block-${block}`}>
          <h2 id={`block-${block}`} className="mb-2 text-heading text-ink">
            Block {block}
          </h2>
          <ul className="divide-y divide-line overflow-hidden rounded-card border border-line bg-surface shadow-card">
            {data.strips
              .filter((s) => s.block === block)
              .map((strip) => {
                const entry = outbox.find((e) => e.stripId === strip.stripId);
                const values = effectiveValues(strip, entry);
                const recorded = recordedGroups(values);
                const { derived, warnings } = liveDerived(data.site, strip, values);
                const yieldText = metric
                  ? formatNumber(
                      derived.yieldKilogramsPerHectare === null
                        ? null
                        : derived.yieldKilogramsPerHectare / 1000,
                      2,
                    )
                  : formatNumber(derived.yieldBushelsPerAcre);
                const yieldUnit = metric ? 't/ha' : 'bu/acre';
                // The link's name carries what the pills show, so a screen reader hears it in one go.
                const state = MEASUREMENT_GROUPS.map(
                  (group) =>
                    `${SHORT[group].toLowerCase()} ${recorded[group] ? 'recorded' : 'missing'}`,
                ).join(', ');
                const name = [
                  `Plot ${strip.plotNumber}, block ${strip.block}, ${strip.label} rate`,
                  state,
                  derived.yieldBushelsPerAcre === null ? null : `yield ${yieldText} ${yieldUnit}`,
                  entry ? 'changes waiting to be sent' : null,
                  warnings.length > 0
                    ? `${warnings.length} ${warnings.length === 1 ? 'value' : 'values'} to check`
                    : null,
                ]
                  .filter(Boolean)
                  .join('; ');
                return (
                  <li key={strip.stripId}>
                    <Link
                      to={`/sites/${data.site.siteId}/strips/${strip.stripId}`}
                      className="flex items-center gap-3 px-4 py-3 no-underline hover:bg-accent-soft"
                      aria-label={name}
                    >
                      <span className="figures flex size-11 shrink-0 flex-col items-center justify-center rounded-field bg-straw-100 text-straw-800">
                        <span className="text-caption leading-none">plot</span>
                        <span className="text-label font-bold leading-tight">
                          {strip.plotNumber}
                        </span>
                      </span>
                      <span className="min-w-0 flex-1">
                        <span className="block font-semibold text-ink">
                          {strip.label}{' '}
                          <span className="font-normal text-ink-muted">· {strip.rate}× rate</span>
                        </span>
                        {/* One element per pill: a site has dozens of strips and a phone lays out every one. */}
                        <span className="mt-1 flex flex-wrap gap-1">
                          {MEASUREMENT_GROUPS.map((group) => (
                            <span
                              key={group}
                              className={cn(
                                'rounded-full px-2 py-0.5 text-caption font-semibold ring-1 ring-inset',
                                recorded[group]
                                  ? 'bg-accent-soft text-accent ring-accent/25'
                                  : 'bg-surface text-ink-muted ring-line-strong/50',
                              )}
                            >
                              {recorded[group] ? '✓ ' : '○ '}
                              {SHORT[group]}
                            </span>
                          ))}
                        </span>
                      </span>
                      <span className="shrink-0 text-right">
                        <span className="figures block font-semibold text-ink">{yieldText}</span>
                        <span className="block text-caption text-ink-muted">{yieldUnit}</span>
                        {entry ? (
                          <span className="block text-caption font-semibold text-caution">
                            waiting
                          </span>
                        ) : null}
                        {warnings.length > 0 ? (
                          <span className="block text-caption font-semibold text-danger">
                            {warnings.length} ▲
                          </span>
                        ) : null}
                      </span>
                    </Link>
                  </li>
                );
              })}
          </ul>
        </section>
      ))}
    </div>
  );
}
