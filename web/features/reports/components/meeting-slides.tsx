// The meeting view: full-screen slides built from the pooled report, moved with the arrow
// keys or clicks, in large type for a projector, light or dark.
import { useCallback, useEffect, useMemo, useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import {
  DARK_CHART_THEME,
  forestSpec,
  LIGHT_CHART_THEME,
  pooledMeansSpec,
  responseCurveSpec,
} from '../../../../shared/reports/chart-specs';
import { rateName } from '../../../../shared/reports/findings';
import { decimalsFor, formatMoney, formatNumber } from '../../../../shared/reports/format-numbers';
import type { PooledReport } from '../../../../shared/schemas/report';
import { cn } from '../../../lib/cn';
import { VegaChart } from './vega-chart';

const capitalise = (text: string) => text.charAt(0).toUpperCase() + text.slice(1);

interface Slide {
  id: string;
  title: string;
  body: ReactNode;
}

function Lines({ items }: { items: string[] }) {
  return (
    <ul className="space-y-5">
      {items.map((item, i) => (
        <li key={i} className="flex gap-4">
          <span aria-hidden="true" className="mt-[0.6em] size-3 shrink-0 rounded-full bg-accent" />
          <span>{item}</span>
        </li>
      ))}
    </ul>
  );
}

export function MeetingSlides({ report, backTo }: { report: PooledReport; backTo: string }) {
  const [index, setIndex] = useState(0);
  const [dark, setDark] = useState(true);
  const { trial, analysis } = report;
  const theme = dark ? DARK_CHART_THEME : LIGHT_CHART_THEME;
  const unit = trial.units.yield;
  const digits = decimalsFor(analysis?.grandMean ?? 50);
  const label = useCallback(
    (rate: string) => trial.rates.find((r) => r.key === rate)?.label ?? rate,
    [trial.rates],
  );
  const referenceLabel = label(trial.reference);
  const keyRate = analysis?.differences.some((d) => d.rate === '0.5')
    ? '0.5'
    : analysis?.differences[0]?.rate;

  const slides = useMemo<Slide[]>(() => {
    const list: Slide[] = [
      {
        id: 'title',
        title: trial.name,
        body: (
          <div className="space-y-6">
            <p className="text-[clamp(1.5rem,3vw,2.6rem)] text-ink-muted">
              {[trial.cropName, trial.season].filter(Boolean).join(' · ')} ·{' '}
              {report.sitesIncluded.length} sites
            </p>
            <p className="text-[clamp(1.1rem,2vw,1.6rem)] text-ink-muted">
              Seeding-rate strip trial, randomized complete blocks at every farm.
            </p>
          </div>
        ),
      },
      {
        id: 'question',
        title: 'The question',
        body: (
          <p className="max-w-[40ch] text-[clamp(1.8rem,4vw,3.4rem)] font-semibold leading-tight">
            {trial.question || 'How much seed do we really need?'}
          </p>
        ),
      },
      {
        id: 'sites',
        title: `${report.sitesIncluded.length} sites in the answer`,
        body: (
          <div className="grid gap-8 lg:grid-cols-2">
            <ul className="grid grid-cols-1 gap-3 sm:grid-cols-2">
              {report.sitesIncluded.map((s) => (
                <li key={s.id} className="rounded-card border border-line bg-surface px-4 py-3">
                  <p className="font-semibold">{s.fieldName}</p>
                  <p className="text-[0.75em] text-ink-muted">
                    {[s.soil, s.previousCrop && `after ${s.previousCrop}`]
                      .filter(Boolean)
                      .join(', ')}
                  </p>
                </li>
              ))}
            </ul>
            {report.sitesExcluded.length > 0 ? (
              <div>
                <p className="mb-3 font-semibold">Left out</p>
                <Lines
                  items={report.sitesExcluded.map((e) => `${e.site.fieldName}: ${e.reason}`)}
                />
              </div>
            ) : (
              <p className="text-ink-muted">Every enrolled site had complete data.</p>
            )}
          </div>
        ),
      },
    ];
    if (analysis) {
      const answerLines = analysis.differences.map((d) => {
        const verdict = d.p < analysis.alpha ? '' : ' (not a detectable difference)';
        return `${capitalise(rateName(label(d.rate)))}: ${formatNumber(Math.abs(d.diff), digits)} ${unit} ${d.diff < 0 ? 'less' : 'more'} than ${rateName(referenceLabel)}${verdict}.`;
      });
      if (keyRate) {
        const perSite = report.siteDifferences.filter((d) => d.rate === keyRate);
        const within = perSite.filter((d) => d.p >= analysis.alpha).length;
        answerLines.push(
          `At ${within} of ${perSite.length} farms ${rateName(label(keyRate))} was within the LSD of ${rateName(referenceLabel)}.`,
        );
      }
      list.push({
        id: 'answer',
        title: 'What we found',
        body: (
          <div className="grid items-start gap-8 lg:grid-cols-[3fr_2fr]">
            <VegaChart
              spec={pooledMeansSpec(
                {
                  means: analysis.means.map((m) => ({
                    label: label(m.rate),
                    mean: m.mean,
                    ciLow: m.ciLow,
                    ciHigh: m.ciHigh,
                  })),
                  yieldUnit: unit,
                },
                { theme, scale: 1.5 },
              )}
              title="Network rate means"
              description="Mean yield over sites with 95 % confidence intervals."
              downloads={false}
            />
            <div className="text-[clamp(1.1rem,1.9vw,1.6rem)]">
              <Lines items={answerLines} />
            </div>
          </div>
        ),
      });
      if (keyRate) {
        list.push({
          id: 'forest',
          title: `${capitalise(rateName(label(keyRate)))} against ${rateName(referenceLabel)}, farm by farm`,
          body: (
            <VegaChart
              spec={forestSpec(
                {
                  rateLabel: label(keyRate),
                  referenceLabel,
                  yieldUnit: unit,
                  sites: report.siteDifferences.filter((d) => d.rate === keyRate),
                  pooled: analysis.differences.find((d) => d.rate === keyRate) ?? null,
                },
                { theme, scale: 1.5 },
              )}
              title="Forest plot"
              description="Each farm’s difference with its 95 % interval; the diamond is the network."
              downloads={false}
            />
          ),
        });
      }
      const curve = analysis.curve;
      list.push({
        id: 'economics',
        title: 'Does it pay?',
        body: (
          <div className="grid items-start gap-8 lg:grid-cols-2">
            <VegaChart
              spec={responseCurveSpec(
                {
                  points: report.siteMeans.map((p) => ({
                    site: p.site,
                    seedRate: p.seedRate ?? Number(p.rate),
                    mean: p.mean,
                  })),
                  curve: curve ?? null,
                  agronomicOptimum: curve?.agronomicOptimum ?? null,
                  economicOptimum: curve?.economicOptimum ?? null,
                  seedUnit: trial.units.seed,
                  yieldUnit: unit,
                },
                { theme, scale: 1.4 },
              )}
              title="Response curve"
              downloads={false}
            />
            <table className="figures w-full text-[clamp(1rem,1.7vw,1.5rem)]">
              <caption className="pb-3 text-left text-[0.8em] text-ink-muted">
                Seed {formatMoney(report.prices.seedPricePerLb)}/lb, grain{' '}
                {formatMoney(report.prices.grainPricePerBu)}/bu, per acre
              </caption>
              <thead>
                <tr className="text-left text-ink-muted">
                  <th className="pb-2 font-semibold">Rate</th>
                  <th className="pb-2 text-right font-semibold">Yield</th>
                  <th className="pb-2 text-right font-semibold">Over seed</th>
                  <th className="pb-2 text-right font-semibold">vs {referenceLabel}</th>
                </tr>
              </thead>
              <tbody>
                {report.economics.map((e) => (
                  <tr
                    key={e.rate}
                    className={cn(
                      'border-t border-line',
                      e.rate === trial.reference && 'text-ink-muted',
                    )}
                  >
                    <th scope="row" className="py-2 text-left font-semibold">
                      {e.label}
                    </th>
                    <td className="py-2 text-right">{formatNumber(e.meanYield, digits)}</td>
                    <td className="py-2 text-right">{formatMoney(e.returnOverSeedCost)}</td>
                    <td className="py-2 text-right">
                      {e.versusReference === null
                        ? '–'
                        : `${e.versusReference > 0.005 ? '+' : ''}${formatMoney(e.versusReference)}`}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        ),
      });
    }
    const couldNot = report.findings.find((f) => f.startsWith('What the network could not tell'));
    list.push({
      id: 'next',
      title: 'What next',
      body: (
        <Lines
          items={[
            ...(couldNot
              ? [couldNot.replace('What the network could not tell: ', 'We could not tell ')]
              : []),
            'Repeat the trial next season, ideally on the same farms, before anyone changes rates on every field.',
            'Growers: read your own site report and compare it with the network.',
            'Rates in a trial are treatments to compare, not recommendations; local extension advice and the seed label come first.',
          ]}
        />
      ),
    });
    return list;
  }, [analysis, report, trial, theme, unit, digits, label, referenceLabel, keyRate]);

  const last = slides.length - 1;
  const go = useCallback(
    (step: number) => setIndex((i) => Math.min(last, Math.max(0, i + step))),
    [last],
  );
  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (event.target instanceof HTMLInputElement) return;
      if (['ArrowRight', 'PageDown', ' ', 'Enter'].includes(event.key)) {
        event.preventDefault();
        go(1);
      } else if (['ArrowLeft', 'PageUp', 'Backspace'].includes(event.key)) {
        event.preventDefault();
        go(-1);
      } else if (event.key === 'Home') setIndex(0);
      else if (event.key === 'End') setIndex(last);
      else if (event.key === 'd') setDark((d) => !d);
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [go, last]);

  const slide = slides[Math.min(index, last)]!;
  return (
    <div className={cn('fixed inset-0 flex flex-col bg-canvas text-ink', dark && 'theme-dark')}>
      <div className="no-print flex items-center justify-between gap-3 px-6 py-3 text-label text-ink-muted">
        <Link to={backTo} className="font-semibold text-accent">
          ← Back to the report
        </Link>
        <span className="flex items-center gap-3">
          <button
            type="button"
            onClick={() => setDark((d) => !d)}
            className="rounded-field border border-line px-3 py-1 font-semibold text-ink"
          >
            {dark ? 'Light' : 'Dark'}
          </button>
          <span aria-live="polite" data-testid="slide-counter">
            {index + 1} / {slides.length}
          </span>
        </span>
      </div>
      <main
        className="relative flex min-h-0 flex-1 cursor-pointer flex-col overflow-y-auto px-[6vw] pb-10 pt-4"
        onClick={(event) => {
          if ((event.target as HTMLElement).closest('button, a')) return;
          const box = event.currentTarget.getBoundingClientRect();
          go(event.clientX - box.left < box.width / 3 ? -1 : 1);
        }}
      >
        <section
          aria-roledescription="slide"
          aria-label={`${index + 1} of ${slides.length}: ${slide.title}`}
          data-slide={slide.id}
          className="flex flex-1 flex-col justify-center gap-[4vh] text-[clamp(1.2rem,2.2vw,2rem)] leading-snug"
        >
          <h1 className="text-[clamp(2rem,4.6vw,4.2rem)] font-bold leading-tight tracking-tight text-ink">
            {slide.title}
          </h1>
          <div>{slide.body}</div>
        </section>
      </main>
      <div className="no-print flex items-center justify-between gap-2 px-2 pb-4 sm:px-6">
        <button
          type="button"
          onClick={() => go(-1)}
          disabled={index === 0}
          className="min-h-12 shrink-0 whitespace-nowrap rounded-field px-3 text-body font-semibold text-accent disabled:opacity-40 sm:px-5"
        >
          ← Previous
        </button>
        <div aria-hidden="true" className="flex min-w-0 gap-1 sm:gap-2">
          {slides.map((s, i) => (
            <span
              key={s.id}
              className={cn('h-2 w-3 rounded-full sm:w-6', i === index ? 'bg-accent' : 'bg-line')}
            />
          ))}
        </div>
        <button
          type="button"
          onClick={() => go(1)}
          disabled={index === last}
          className="min-h-12 shrink-0 whitespace-nowrap rounded-field px-3 text-body font-semibold text-accent disabled:opacity-40 sm:px-5"
        >
          Next →
        </button>
      </div>
    </div>
  );
}
