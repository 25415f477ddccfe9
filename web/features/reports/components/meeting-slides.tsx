// The meeting view: full-screen slides built from the pooled report, moved with the arrow
// keys or clicks, in large type for a projector, light or dark.
import { useCallback, useEffect, useMemo, useState, type ReactNode } from 'react';
import { Link } from 'react-router-dom';
import { DARK_CHART_THEME, LIGHT_CHART_THEME } from '../../../../shared/reports/chart-specs';
import { decimalsFor } from '../../../../shared/reports/format-numbers';
import type { PooledReport } from '../../../../shared/schemas/report';
import { cn } from '../../../lib/cn';
import {
  AnswerSlide,
  EconomicsSlide,
  ForestSlide,
  forestTitle,
  NextSlide,
  QuestionSlide,
  SitesSlide,
  StatisticianSlide,
  TitleSlide,
  type SlideContext,
} from './meeting-slide-pages';

interface Slide {
  id: string;
  title: string;
  body: ReactNode;
}

/** The slides in order; the analysis slides only when there is an analysis. */
function buildSlides(ctx: SlideContext): Slide[] {
  const { report } = ctx;
  const analysis = report.analysis;
  const slides: Slide[] = [
    { id: 'title', title: report.trial.name, body: <TitleSlide {...ctx} /> },
    { id: 'question', title: 'The question', body: <QuestionSlide {...ctx} /> },
    {
      id: 'sites',
      title: `${report.sitesIncluded.length} sites in the answer`,
      body: <SitesSlide {...ctx} />,
    },
  ];
  if (analysis) {
    const full = { ...ctx, analysis };
    slides.push({ id: 'answer', title: 'What we found', body: <AnswerSlide {...full} /> });
    if (ctx.keyRate)
      slides.push({ id: 'forest', title: forestTitle(ctx), body: <ForestSlide {...full} /> });
    slides.push({ id: 'economics', title: 'Does it pay?', body: <EconomicsSlide {...full} /> });
  }
  slides.push({ id: 'next', title: 'What next', body: <NextSlide {...ctx} /> });
  if ((report.forStatistician ?? []).length > 0)
    slides.push({
      id: 'statistician',
      title: 'For the statistician',
      body: <StatisticianSlide {...ctx} />,
    });
  return slides;
}

/** Arrow keys, Page Up/Down, space, Home and End move; "d" switches light and dark. */
function useSlideKeys(
  go: (step: number) => void,
  jump: (index: number) => void,
  last: number,
  toggleDark: () => void,
) {
  useEffect(() => {
    const onKey = (event: KeyboardEvent) => {
      if (event.target instanceof HTMLInputElement) return;
      if (['ArrowRight', 'PageDown', ' ', 'Enter'].includes(event.key)) {
        event.preventDefault();
        go(1);
      } else if (['ArrowLeft', 'PageUp', 'Backspace'].includes(event.key)) {
        event.preventDefault();
        go(-1);
      } else if (event.key === 'Home') jump(0);
      else if (event.key === 'End') jump(last);
      else if (event.key === 'd') toggleDark();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [go, jump, last, toggleDark]);
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

  const slides = useMemo(
    () => buildSlides({ report, theme, label, referenceLabel, unit, digits, keyRate }),
    [report, theme, label, referenceLabel, unit, digits, keyRate],
  );
  const last = slides.length - 1;
  const go = useCallback(
    (step: number) => setIndex((i) => Math.min(last, Math.max(0, i + step))),
    [last],
  );
  const toggleDark = useCallback(() => setDark((d) => !d), []);
  useSlideKeys(go, setIndex, last, toggleDark);

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
      {/* A long slide scrolls (a small screen, a wide font): the slide area takes the keyboard's
          focus so that the up and down arrows scroll it; the other keys still turn slides. */}
      <main
        tabIndex={0}
        aria-label="Slides"
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
