// A site's strip map drawn as SVG: blocks in field order, each strip with its rate, multiplier and
// seed weight, a pattern per rate for greyscale print, and a legend.
import type { Layout } from '../../../../shared/schemas/layout';
import { rateStyles } from './strip-palette';

const WIDTH = 400;
const GUTTER = 34;
const STRIP_HEIGHT = 34;
const STRIP_GAP = 4;
const BLOCK_HEADER = 26;
const BLOCK_GAP = 14;

const grams = new Intl.NumberFormat('en', { maximumFractionDigits: 0 });

export function StripMap({
  layout,
  title,
  startEdgeLabel = 'Start edge of the field',
}: {
  layout: Layout;
  title: string;
  startEdgeLabel?: string;
}) {
  const strips = layout.blocks.flatMap((b) => b.strips);
  const styles = rateStyles(strips.map((s) => s.rate));
  const legend = [...new Map(strips.map((s) => [s.rate, s])).values()].sort(
    (a, b) => a.rate - b.rate,
  );
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
        <defs>
          {[...styles.entries()].map(([rate, style]) =>
            style.hatchGap > 0 ? (
              <pattern
                key={rate}
                id={`hatch-${layout.siteId}-${String(rate).replace('.', '_')}`}
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
        <text x={GUTTER} y={14} fontSize="11" fill="#6a5a49">
          ▲ {startEdgeLabel}
        </text>
        {blockRows.map(({ block, top }) => (
          <g key={block.block} aria-label={`Block ${block.block}`}>
            <text x={0} y={top + 17} fontSize="13" fontWeight="700" fill="#26201b">
              Block {block.block}
            </text>
            {block.strips.map((strip, i) => {
              const style = styles.get(strip.rate)!;
              const sy = top + BLOCK_HEADER + i * (STRIP_HEIGHT + STRIP_GAP);
              const fill =
                style.hatchGap > 0
                  ? `url(#hatch-${layout.siteId}-${String(strip.rate).replace('.', '_')})`
                  : style.fill;
              return (
                <g key={strip.stripId} data-rate={strip.rate}>
                  <text
                    x={GUTTER - 8}
                    y={sy + STRIP_HEIGHT / 2 + 4}
                    fontSize="12"
                    textAnchor="end"
                    fill="#6a5a49"
                  >
                    {strip.plotNumber}
                  </text>
                  <rect
                    x={GUTTER}
                    y={sy}
                    width={WIDTH - GUTTER - 2}
                    height={STRIP_HEIGHT}
                    rx="3"
                    fill={fill}
                    stroke="#26201b"
                    strokeWidth="1"
                  />
                  <rect
                    x={GUTTER + 6}
                    y={sy + 6}
                    width={Math.min(
                      170,
                      12 + 7.2 * (strip.label.length + String(strip.rate).length + 3),
                    )}
                    height={STRIP_HEIGHT - 12}
                    rx="3"
                    fill={style.fill}
                  />
                  <text
                    x={GUTTER + 12}
                    y={sy + STRIP_HEIGHT / 2 + 5}
                    fontSize="13"
                    fontWeight="700"
                    fill={style.text}
                  >
                    {strip.label} ×{strip.rate}
                  </text>
                  <rect
                    x={WIDTH - 86}
                    y={sy + 6}
                    width={78}
                    height={STRIP_HEIGHT - 12}
                    rx="3"
                    fill={style.fill}
                  />
                  <text
                    x={WIDTH - 14}
                    y={sy + STRIP_HEIGHT / 2 + 5}
                    fontSize="13"
                    fontWeight="600"
                    textAnchor="end"
                    fill={style.text}
                  >
                    {strip.seedGrams > 0 ? `${grams.format(strip.seedGrams)} g` : '— g'}
                  </text>
                </g>
              );
            })}
          </g>
        ))}
      </svg>
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
                    fill={
                      style.hatchGap > 0
                        ? `url(#hatch-${layout.siteId}-${String(s.rate).replace('.', '_')})`
                        : style.fill
                    }
                    stroke="#26201b"
                  />
                </svg>
                <span>
                  <strong>{s.label}</strong> ×{s.rate}
                  {s.seedGrams > 0 ? ` · ${grams.format(s.seedGrams)} g/strip` : ''}
                </span>
              </li>
            );
          })}
        </ul>
        <p className="mt-2 text-caption text-ink-muted">
          Strips are numbered from the start edge within each block; darker strips are heavier
          rates. Seed {layout.seed ? `“${layout.seed}”` : ''}.
        </p>
      </figcaption>
    </figure>
  );
}
