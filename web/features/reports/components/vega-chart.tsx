// Renders a Vega-Lite spec with vega-embed, loaded lazily so only report pages download the
// charting chunk; the expression interpreter keeps Vega within the CSP (no eval).
import { useEffect, useRef, useState } from 'react';
import type { ChartSpec } from '../../../../shared/reports/chart-specs';
import { cn } from '../../../lib/cn';

interface ChartView {
  toSVG(): Promise<string>;
  toImageURL(type: 'png', scale?: number): Promise<string>;
}

export interface VegaChartProps {
  /** A spec that fills its container itself (width "container"). */
  spec?: ChartSpec;
  /** For specs that cannot say "container" (faceted charts): built for the measured width. */
  specForWidth?: (width: number) => ChartSpec;
  /** Accessible name of the chart and the base of downloaded file names. */
  title: string;
  /** One sentence saying what the chart shows, for screen readers and under the chart. */
  description?: string;
  downloads?: boolean;
  className?: string;
}

function download(url: string, fileName: string) {
  const link = document.createElement('a');
  link.href = url;
  link.download = fileName;
  document.body.appendChild(link);
  link.click();
  link.remove();
}

const slug = (text: string) =>
  text
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-|-$/g, '') || 'chart';

/** The element's width, rounded to 40 px so a resize redraws only when it matters. */
function useRoundedWidth(element: React.RefObject<HTMLElement | null>, active: boolean) {
  const [width, setWidth] = useState(0);
  useEffect(() => {
    if (!active || !element.current) return;
    const observer = new ResizeObserver(([entry]) => {
      if (entry) setWidth(Math.max(200, Math.round(entry.contentRect.width / 40) * 40));
    });
    observer.observe(element.current);
    return () => observer.disconnect();
  }, [element, active]);
  return width;
}

export function VegaChart({
  spec,
  specForWidth,
  title,
  description,
  downloads = true,
  className,
}: VegaChartProps) {
  const container = useRef<HTMLDivElement>(null);
  const view = useRef<ChartView | null>(null);
  const [state, setState] = useState<'loading' | 'ready' | 'failed'>('loading');
  const width = useRoundedWidth(container, Boolean(specForWidth));
  const actual = specForWidth ? (width > 0 ? specForWidth(width) : null) : (spec ?? null);
  const specKey = actual ? JSON.stringify(actual) : '';

  useEffect(() => {
    let cancelled = false;
    let finalize: (() => void) | undefined;
    if (!specKey) return;
    setState('loading');
    (async () => {
      const [{ default: embed }, { expressionInterpreter }] = await Promise.all([
        import('vega-embed'),
        import('vega-interpreter'),
      ]);
      if (cancelled || !container.current) return;
      const result = await embed(container.current, JSON.parse(specKey), {
        actions: false,
        renderer: 'svg',
        ast: true,
        expr: expressionInterpreter,
      });
      if (cancelled) {
        result.finalize();
        return;
      }
      finalize = result.finalize;
      view.current = result.view as unknown as ChartView;
      setState('ready');
    })().catch(() => {
      if (!cancelled) setState('failed');
    });
    return () => {
      cancelled = true;
      view.current = null;
      finalize?.();
    };
  }, [specKey]);

  const saveSvg = async () => {
    if (!view.current) return;
    const svg = await view.current.toSVG();
    const url = URL.createObjectURL(new Blob([svg], { type: 'image/svg+xml' }));
    download(url, `${slug(title)}.svg`);
    setTimeout(() => URL.revokeObjectURL(url), 1000);
  };
  const savePng = async () => {
    if (!view.current) return;
    download(await view.current.toImageURL('png', 2), `${slug(title)}.png`);
  };

  return (
    <figure className={cn('min-w-0', className)}>
      <div
        ref={container}
        role="img"
        aria-label={description ? `${title}. ${description}` : title}
        data-chart={slug(title)}
        data-state={state}
        className="w-full min-h-24"
      />
      {state === 'loading' ? (
        <p className="py-6 text-center text-label text-ink-muted">Drawing the chart…</p>
      ) : null}
      {state === 'failed' ? (
        <p className="py-6 text-center text-label text-danger">
          The chart could not be drawn; the table below has the same numbers.
        </p>
      ) : null}
      {description || downloads ? (
        <figcaption className="mt-2 flex flex-wrap items-start justify-between gap-2 text-caption text-ink-muted">
          {description ? <span className="max-w-prose">{description}</span> : <span />}
          {downloads && state === 'ready' ? (
            <span className="no-print flex gap-1">
              <button
                type="button"
                onClick={saveSvg}
                className="rounded-field px-2 py-1 font-semibold text-accent hover:bg-accent-soft"
              >
                SVG
              </button>
              <button
                type="button"
                onClick={savePng}
                className="rounded-field px-2 py-1 font-semibold text-accent hover:bg-accent-soft"
              >
                PNG
              </button>
            </span>
          ) : null}
        </figcaption>
      ) : null}
    </figure>
  );
}
