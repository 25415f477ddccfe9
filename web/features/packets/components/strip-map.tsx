// A site's strip map drawn as SVG: blocks in field order, each strip with its rate, multiplier and
// seed weight, a pattern per rate for greyscale print, and a legend.
import { PRINT } from '../../../../shared/brand/colours';
import { seedGrams } from '../../../../shared/labels/labels';
import type { Layout } from '../../../../shared/schemas/layout';
import { rateStyles, type RateStyle } from './strip-palette';

const WIDTH = 400;
const GUTTER = 34;
const STRIP_HEIGHT = 34;
const STRIP_GAP = 4;
const BLOCK_HEADER = 26;
const BLOCK_GAP = 14;

type LayoutStrip = Layout['blocks'][number]['strips'][number];
type Styles = Map<number, RateStyle>;

const hatchId = (siteId: string, rate: number) =>
  `hatch-${siteId}-${String(rate).replace('.', '_')}`;

/** One hatch pattern per rate (the lightest has none), so rates differ in greyscale print. */
function HatchPatterns({ siteId, styles }: { siteId: string; styles: Styles }) {
  return (
    <defs>
      {[...styles.entries()].map(([rate, style]) =>
        style.hatchGap > 0 ? (
          <pattern
            key={rate}
            id={hatchId(siteId, rate)}
            width={style.hatchGap}
            height={style.hatchGap}
            patternUnits="userSpaceOnUse"
            patternTransform="rotate(45)"
          >
            <rect width={style.hatchGap} height={style.hatchGap} fill={style.fill} />
            <line
              x1="0"
              y1="0"
              x2="0"
              y2={style.hatchGap}
              stroke={style.hatchColour}
              strokeWidth="2"
            />
          </pattern>
        ) : null,
      )}
    </defs>
  );
}

/** One strip: its position, a bar in the rate's pattern, the rate and the seed to weigh. */
function StripBar({
  siteId,
  strip,
  style,
  y,
}: {
  siteId: string;
  strip: LayoutStrip;
  style: RateStyle;
  y: number;
}) {
  const fill = style.hatchGap > 0 ? `url(#${hatchId(siteId, strip.rate)})` : style.fill;
  const mid = y + STRIP_HEIGHT / 2;
  return (
    <g data-rate={strip.rate}>
      <text x={GUTTER - 8} y={mid + 4} fontSize="12" textAnchor="end" fill={PRINT.muted}>
        {strip.plotNumber}
      </text>
      <rect
        x={GUTTER}
        y={y}
        width={WIDTH - GUTTER - 2}
        height={STRIP_HEIGHT}
        rx="3"
        fill={fill}
        stroke={PRINT.ink}
        strokeWidth="1"
      />
      <rect
        x={GUTTER + 6}
        y={y + 6}
        width={Math.min(170, 12 + 7.2 * (strip.label.length + String(strip.rate).length + 3))}
        height={STRIP_HEIGHT - 12}
        rx="3"
        fill={style.fill}
      />
      <text x={GUTTER + 12} y={mid + 5} fontSize="13" fontWeight="700" fill={style.text}>
        {strip.label} ×{strip.rate}
      </text>
      <rect
        x={WIDTH - 86}
        y={y + 6}
        width={78}
        height={STRIP_HEIGHT - 12}
        rx="3"
        fill={style.fill}
      />
      <text
        x={WIDTH - 14}
        y={mid + 5}
        fontSize="13"
        fontWeight="600"
        textAnchor="end"
        fill={style.text}
      >
        {seedGrams(strip.seedGrams)}
      </text>
    </g>
  );
}

function StripMapLegend({ layout, styles }: { layout: Layout; styles: Styles }) {
  const strips = layout.blocks.flatMap((b) => b.strips);
  const legend = [...new Map(strips.map((s) => [s.rate, s])).values()].sort(
    (a, b) => a.rate - b.rate,
  );
  return (
    <figcaption>
      <ul className="mt-3 flex flex-wrap gap-x-5 gap-y-2 text-label" aria-label="Legend">
        {legend.map((s) => {
          const style = styles.get(s.rate)!;
          return (
            <li key={s.rate} className="flex items-center gap-2">
              <svg width="28" height="18" aria-hidden="true">
                <rect
                  width="28"
                  height="18"
                  rx="3"
                  fill={style.hatchGap > 0 ? `url(#${hatchId(layout.siteId, s.rate)})` : style.fill}
                  stroke={PRINT.ink}
                />
              </svg>
              <span>
                <strong>{s.label}</strong> ×{s.rate}
                {s.seedGrams > 0 ? ` · ${seedGrams(s.seedGrams)}/strip` : ''}
              </span>
            </li>
          );
        })}
      </ul>
      <p className="mt-2 text-caption text-ink-muted">
        Blocks run from the start edge down, strips in sowing order within each block; darker strips
        are heavier rates.
        {layout.seed ? ` Layout code ${layout.seed} (re-creates this same random order).` : ''}
      </p>
    </figcaption>
  );
}

export function StripMap({
  layout,
  title,
  startEdgeLabel = 'Start edge of the field',
}: {
  layout: Layout;
  title: string;
  startEdgeLabel?: string;
}) {
  const styles = rateStyles(layout.blocks.flatMap((b) => b.strips.map((s) => s.rate)));
  let y = 24;
  const blockRows = layout.blocks.map((block) => {
    const top = y;
    y += BLOCK_HEADER + block.strips.length * (STRIP_HEIGHT + STRIP_GAP) + BLOCK_GAP;
    return { block, top };
  });
  const height = y;
  const titleId = `map-title-${layout.siteId}`;
  return (
    <figure
      className="strip-map mx-auto w-full max-w-xl"
      // In print the map must fit one page under the packet header: about 175 mm of height.
      style={
        {
          '--map-print-width': `${Math.min(150, (175 * WIDTH) / height).toFixed(0)}mm`,
        } as React.CSSProperties
      }
    >
      <svg
        viewBox={`0 0 ${WIDTH} ${height}`}
        role="img"
        aria-labelledby={titleId}
        className="h-auto w-full"
        style={{ fontFamily: 'inherit' }}
      >
        <title id={titleId}>{title}</title>
        <HatchPatterns siteId={layout.siteId} styles={styles} />
        <text x={GUTTER} y={14} fontSize="11" fill={PRINT.muted}>
          ▲ {startEdgeLabel}
        </text>
        {blockRows.map(({ block, top }) => (
          <g key={block.block} aria-label={`Block ${block.block}`}>
            <text x={0} y={top + 17} fontSize="13" fontWeight="700" fill={PRINT.ink}>
              Block {block.block}
            </text>
            {block.strips.map((strip, i) => (
              <StripBar
                key={strip.stripId}
                siteId={layout.siteId}
                strip={strip}
                style={styles.get(strip.rate)!}
                y={top + BLOCK_HEADER + i * (STRIP_HEIGHT + STRIP_GAP)}
              />
            ))}
          </g>
        ))}
      </svg>
      <StripMapLegend layout={layout} styles={styles} />
    </figure>
  );
}
