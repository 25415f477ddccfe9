// Vega-Lite specs for the report charts, as pure functions of report data so they can be
// tested and rendered the same way in the browser and in the server's PDF.

import {
  DARK_CHART,
  LIGHT_CHART,
  soil,
  white,
  YIELD_RAMP,
  type ChartColours,
} from '../brand/colours';

/** A Vega-Lite top-level spec (kept as plain JSON so shared/ needs no charting import). */
export type ChartSpec = Record<string, unknown>;

/** Fonts and colours of one chart theme; every colour comes from shared/brand/colours.ts. */
export interface ChartTheme extends ChartColours {
  font: string;
  /** Sequential colour ramp for yield maps (brand tokens, low to high). */
  yieldRamp: readonly string[];
  /** Label colours on the light and dark halves of the yield map's scale. */
  onLight: string;
  onDark: string;
}

const CHART_FONT = 'Inter Variable, Inter, system-ui, sans-serif';

export const LIGHT_CHART_THEME: ChartTheme = {
  ...LIGHT_CHART,
  font: CHART_FONT,
  yieldRamp: YIELD_RAMP,
  onLight: soil[900],
  onDark: white,
};

export const DARK_CHART_THEME: ChartTheme = {
  ...DARK_CHART,
  font: CHART_FONT,
  yieldRamp: YIELD_RAMP,
  onLight: soil[900],
  onDark: white,
};

/** Shared config: the app's font and colours, quiet grid lines, readable label sizes. */
export function chartConfig(theme: ChartTheme, scale = 1): Record<string, unknown> {
  return {
    font: theme.font,
    background: theme.background,
    view: { stroke: null },
    axis: {
      labelColor: theme.muted,
      titleColor: theme.ink,
      gridColor: theme.line,
      domainColor: theme.muted,
      tickColor: theme.muted,
      labelFontSize: 12 * scale,
      titleFontSize: 13 * scale,
      titleFontWeight: 600,
    },
    legend: {
      labelColor: theme.ink,
      titleColor: theme.ink,
      labelFontSize: 12 * scale,
      titleFontSize: 12 * scale,
    },
    title: { color: theme.ink, fontSize: 15 * scale, anchor: 'start' },
    text: { color: theme.ink },
  };
}

interface BaseOptions {
  theme?: ChartTheme;
  /** Type scale for projectors (1 = page). */
  scale?: number;
  title?: string;
  /** One sentence on what the chart shows; screen readers announce it as the chart's name. */
  description?: string;
}

/** Tooltip number format for a yield: two decimals in t/ha (4.52), one in bu/acre or kg/ha. */
const yieldFormat = (yieldUnit: string) => (yieldUnit === 't/ha' ? '.2f' : '.1f');

const sorted = <T extends { order: number }>(items: readonly T[]) =>
  [...items].sort((a, b) => a.order - b.order);

/**
 * Rate means with their 95 % confidence intervals, the individual strips as open points
 * beside them.
 *
 * @param input - means (label, mean, CI) in rate order, strips (label, yield) and the yield unit
 * @returns a layered Vega-Lite spec
 */
export function rateMeansSpec(
  input: {
    means: readonly { label: string; mean: number; ciLow: number; ciHigh: number }[];
    strips: readonly { label: string; yield: number | null; block: number }[];
    yieldUnit: string;
  },
  options: BaseOptions = {},
): ChartSpec {
  const theme = options.theme ?? LIGHT_CHART_THEME;
  const order = input.means.map((m) => m.label);
  const x = {
    field: 'label',
    type: 'nominal',
    title: 'Seeding rate',
    sort: order,
    axis: { labelAngle: 0 },
  };
  const y = { type: 'quantitative', title: `Yield (${input.yieldUnit})`, scale: { zero: false } };
  const stripPoints = input.strips
    .filter((s) => s.yield !== null)
    .map((s) => ({ label: s.label, yield: s.yield, block: s.block }));
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    ...(options.title ? { title: options.title } : {}),
    description:
      options.description ??
      `Mean yield (${input.yieldUnit}) at each seeding rate with its 95 % confidence interval; open points are the single strips.`,
    width: 'container',
    height: 260 * (options.scale ?? 1),
    autosize: { type: 'fit-x', contains: 'padding' },
    config: chartConfig(theme, options.scale),
    layer: [
      // The pooled report has no individual strips: leave the layer out rather than draw an empty one.
      ...(stripPoints.length === 0
        ? []
        : [
            {
              data: { values: stripPoints },
              mark: {
                type: 'point',
                filled: false,
                size: 50 * (options.scale ?? 1),
                color: theme.muted,
                opacity: 0.9,
                xOffset: 14,
              },
              encoding: {
                x,
                y: { ...y, field: 'yield' },
                tooltip: [
                  { field: 'label', title: 'Rate' },
                  { field: 'block', title: 'Block' },
                  { field: 'yield', title: 'Strip yield', format: yieldFormat(input.yieldUnit) },
                ],
              },
            },
          ]),
      {
        data: { values: input.means.map((m) => ({ ...m })) },
        layer: [
          {
            mark: { type: 'rule', color: theme.estimate, strokeWidth: 2.5 * (options.scale ?? 1) },
            encoding: { x, y: { ...y, field: 'ciLow' }, y2: { field: 'ciHigh' } },
          },
          {
            mark: {
              type: 'point',
              filled: true,
              size: 110 * (options.scale ?? 1),
              color: theme.estimate,
              opacity: 1,
            },
            encoding: {
              x,
              y: { ...y, field: 'mean' },
              tooltip: [
                { field: 'label', title: 'Rate' },
                { field: 'mean', title: 'Mean', format: yieldFormat(input.yieldUnit) },
                { field: 'ciLow', title: '95 % CI low', format: yieldFormat(input.yieldUnit) },
                { field: 'ciHigh', title: '95 % CI high', format: yieldFormat(input.yieldUnit) },
              ],
            },
          },
        ],
      },
    ],
  };
}

/**
 * Yield components by rate: plants and heads per ft² (per m² on a metric trial) and tillers per
 * plant, one small panel each.
 */
export function componentsSpec(
  input: {
    rows: readonly {
      label: string;
      plantsPerSquareFoot: number | null;
      tillersPerPlant: number | null;
      headsPerSquareFoot: number | null;
    }[];
    /** Counts are stored per ft²; a metric trial shows them per m². Per ft² when absent. */
    perArea?: { unit: string; fromStored: (stored: number) => number };
  },
  options: BaseOptions & { columns?: number; panelWidth?: number } = {},
): ChartSpec {
  const theme = options.theme ?? LIGHT_CHART_THEME;
  const order = input.rows.map((r) => r.label);
  // Rate labels are turned when there are many, so they never run together ("quarterhalf").
  const labelAngle = order.length > 3 ? -40 : 0;
  const areaUnit = input.perArea?.unit ?? 'ft²';
  const perArea = input.perArea?.fromStored ?? ((v: number) => v);
  const measures = [
    { key: 'plantsPerSquareFoot', title: `Plants per ${areaUnit}`, convert: perArea },
    { key: 'tillersPerPlant', title: 'Tillers per plant', convert: (v: number) => v },
    { key: 'headsPerSquareFoot', title: `Heads per ${areaUnit}`, convert: perArea },
  ] as const;
  const values = input.rows.flatMap((row) =>
    measures.flatMap((m) => {
      const value = row[m.key];
      return value === null
        ? []
        : [{ label: row.label, measure: m.title, value: m.convert(value) }];
    }),
  );
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    ...(options.title ? { title: options.title } : {}),
    description:
      options.description ??
      'Stand, tillers and heads at each seeding rate: the yield components, means over blocks.',
    config: chartConfig(theme, options.scale),
    data: { values },
    columns: options.columns ?? 3,
    facet: {
      field: 'measure',
      type: 'nominal',
      title: null,
      sort: measures.map((m) => m.title),
      header: {
        labelColor: theme.ink,
        labelFontSize: 12 * (options.scale ?? 1),
        labelFontWeight: 600,
      },
    },
    spec: {
      width: (options.panelWidth ?? 140) * (options.scale ?? 1),
      height: 150 * (options.scale ?? 1),
      mark: { type: 'bar', color: theme.bar, cornerRadiusEnd: 2 },
      encoding: {
        x: {
          field: 'label',
          type: 'nominal',
          sort: order,
          title: null,
          axis: { labelAngle, labelAlign: labelAngle ? 'right' : 'center', labelPadding: 4 },
          scale: { paddingInner: 0.25 },
        },
        y: { field: 'value', type: 'quantitative', title: null },
        tooltip: [
          { field: 'measure', title: 'Measure' },
          { field: 'label', title: 'Rate' },
          { field: 'value', title: 'Mean', format: '.2f' },
        ],
      },
    },
    resolve: { scale: { y: 'independent' } },
  };
}

/**
 * The strip map, drawn the way the field packet's map is: blocks from the start edge down and,
 * within each block, strips in sowing order, one bar per strip coloured by its yield and
 * labelled with its rate, so a grower can see a wet corner or a weak block at a glance.
 */
export function stripMapSpec(
  input: {
    strips: readonly { block: number; position: number; label: string; yield: number | null }[];
    yieldUnit: string;
  },
  options: BaseOptions = {},
): ChartSpec {
  const theme = options.theme ?? LIGHT_CHART_THEME;
  const scale = options.scale ?? 1;
  const ordered = [...input.strips].sort((a, b) => a.block - b.block || a.position - b.position);
  const values = ordered.map((s) => ({
    strip: `Block ${s.block} · strip ${s.position}`,
    block: s.block,
    position: s.position,
    label: s.label,
    yield: s.yield,
    text: s.yield === null ? `${s.label} · no yield` : s.label,
  }));
  const yields = values.map((v) => v.yield).filter((y): y is number => y !== null);
  const midpoint = yields.length > 0 ? (Math.min(...yields) + Math.max(...yields)) / 2 : 0;
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    ...(options.title ? { title: options.title } : {}),
    description:
      options.description ??
      'The strips as laid out in the field, block by block, shaded by yield.',
    width: 'container',
    height: Math.max(1, values.length) * 24 * scale,
    autosize: { type: 'fit-x', contains: 'padding' },
    config: chartConfig(theme, options.scale),
    data: { values },
    encoding: {
      y: {
        field: 'strip',
        type: 'ordinal',
        title: '▼ from the start edge',
        sort: values.map((v) => v.strip),
        axis: { labelLimit: 0 },
      },
    },
    layer: [
      {
        mark: { type: 'rect', stroke: theme.background, strokeWidth: 2, cornerRadius: 3 },
        encoding: {
          color: {
            field: 'yield',
            type: 'quantitative',
            title: input.yieldUnit,
            scale: { range: [...theme.yieldRamp] },
            legend: { orient: 'bottom', gradientLength: 160 },
          },
          tooltip: [
            { field: 'block', title: 'Block' },
            { field: 'position', title: 'Strip' },
            { field: 'label', title: 'Rate' },
            {
              field: 'yield',
              title: `Yield (${input.yieldUnit})`,
              format: yieldFormat(input.yieldUnit),
            },
          ],
        },
      },
      {
        mark: { type: 'text', fontSize: 11 * scale, fontWeight: 600 },
        encoding: {
          text: { field: 'text' },
          // Light text on the darker (higher-yield) half of the colour scale keeps labels readable.
          color: {
            condition: {
              test: `datum.yield !== null && datum.yield > ${midpoint}`,
              value: theme.onDark,
            },
            value: theme.onLight,
          },
        },
      },
    ],
  };
}

/**
 * Forest plot: each site's difference from the reference rate with its 95 % CI, the pooled
 * difference as a diamond at the bottom and a line at zero.
 */
export function forestSpec(
  input: {
    rateLabel: string;
    referenceLabel: string;
    yieldUnit: string;
    sites: readonly { site: string; diff: number; ciLow: number; ciHigh: number }[];
    pooled?: { diff: number; ciLow: number; ciHigh: number } | null;
  },
  options: BaseOptions = {},
): ChartSpec {
  const theme = options.theme ?? LIGHT_CHART_THEME;
  const pooledName = 'All sites (pooled)';
  const rows = [
    ...input.sites.map((s, i) => ({ ...s, kind: 'site', order: i })),
    ...(input.pooled
      ? [{ site: pooledName, ...input.pooled, kind: 'pooled', order: input.sites.length }]
      : []),
  ];
  const order = sorted(rows).map((r) => r.site);
  const y = { field: 'site', type: 'nominal', title: null, sort: order, axis: { labelLimit: 0 } };
  const x = {
    type: 'quantitative',
    title: `${input.rateLabel} minus ${input.referenceLabel} (${input.yieldUnit})`,
  };
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    ...(options.title ? { title: options.title } : {}),
    description:
      options.description ??
      'Difference in yield from the reference rate at each site, with 95 % confidence intervals.',
    width: 'container',
    height: Math.max(2, rows.length) * 26 * (options.scale ?? 1),
    autosize: { type: 'fit-x', contains: 'padding' },
    config: chartConfig(theme, options.scale),
    layer: [
      {
        data: { values: [{ zero: 0 }] },
        mark: { type: 'rule', color: theme.muted, strokeDash: [4, 4] },
        encoding: { x: { ...x, field: 'zero' } },
      },
      {
        data: { values: rows },
        layer: [
          {
            mark: { type: 'rule', strokeWidth: 2 * (options.scale ?? 1) },
            encoding: {
              y,
              x: { ...x, field: 'ciLow' },
              x2: { field: 'ciHigh' },
              // Conditions rather than a second colour scale: the point layer colours by kind too.
              color: {
                condition: { test: "datum.kind === 'pooled'", value: theme.estimate },
                value: theme.muted,
              },
            },
          },
          {
            mark: { type: 'point', filled: true, opacity: 1 },
            encoding: {
              y,
              x: { ...x, field: 'diff' },
              shape: {
                field: 'kind',
                type: 'nominal',
                legend: null,
                scale: { domain: ['site', 'pooled'], range: ['square', 'diamond'] },
              },
              size: {
                condition: { test: "datum.kind === 'pooled'", value: 220 * (options.scale ?? 1) },
                value: 70 * (options.scale ?? 1),
              },
              color: {
                condition: { test: "datum.kind === 'pooled'", value: theme.estimate },
                value: theme.ink,
              },
              tooltip: [
                { field: 'site', title: 'Site' },
                { field: 'diff', title: 'Difference', format: yieldFormat(input.yieldUnit) },
                { field: 'ciLow', title: '95 % CI low', format: yieldFormat(input.yieldUnit) },
                { field: 'ciHigh', title: '95 % CI high', format: yieldFormat(input.yieldUnit) },
              ],
            },
          },
        ],
      },
    ],
  };
}

/**
 * The response curve over site means: every site × rate mean as a point, the fitted
 * quadratic over the tested range, and the agronomic and economic optima as vertical lines.
 */
export function responseCurveSpec(
  input: {
    points: readonly { site: string; seedRate: number; mean: number }[];
    curve: {
      intercept: number;
      linear: number;
      quadratic: number;
      testedRange: { low: number; high: number };
    } | null;
    agronomicOptimum: number | null;
    economicOptimum: number | null;
    seedUnit: string;
    yieldUnit: string;
  },
  options: BaseOptions = {},
): ChartSpec {
  const theme = options.theme ?? LIGHT_CHART_THEME;
  // Padding keeps the points at the lowest and highest rates inside the plot.
  const x = {
    type: 'quantitative',
    title: `Seeding rate (${input.seedUnit})`,
    scale: { zero: false, nice: true, padding: 12 },
  };
  const y = { type: 'quantitative', title: `Yield (${input.yieldUnit})`, scale: { zero: false } };
  const layers: ChartSpec[] = [
    {
      data: { values: input.points.map((p) => ({ ...p })) },
      mark: {
        type: 'point',
        filled: true,
        opacity: 0.55,
        color: theme.muted,
        size: 45 * (options.scale ?? 1),
      },
      encoding: {
        x: { ...x, field: 'seedRate' },
        y: { ...y, field: 'mean' },
        tooltip: [
          { field: 'site', title: 'Site' },
          { field: 'seedRate', title: 'Rate', format: '.1f' },
          { field: 'mean', title: 'Site mean', format: yieldFormat(input.yieldUnit) },
        ],
      },
    },
  ];
  if (input.curve) {
    const { intercept, linear, quadratic, testedRange } = input.curve;
    const steps = 40;
    const line = Array.from({ length: steps + 1 }, (_, i) => {
      const rate = testedRange.low + ((testedRange.high - testedRange.low) * i) / steps;
      return { seedRate: rate, fitted: intercept + linear * rate + quadratic * rate * rate };
    });
    layers.push({
      data: { values: line },
      mark: { type: 'line', color: theme.curve, strokeWidth: 3 * (options.scale ?? 1) },
      encoding: { x: { ...x, field: 'seedRate' }, y: { ...y, field: 'fitted' } },
    });
  }
  const optima = [
    input.agronomicOptimum !== null
      ? { rate: input.agronomicOptimum, name: 'Highest yield' }
      : null,
    input.economicOptimum !== null
      ? { rate: input.economicOptimum, name: 'Best return over seed' }
      : null,
  ].filter((o): o is { rate: number; name: string } => o !== null);
  if (optima.length > 0) {
    layers.push({
      data: { values: optima },
      layer: [
        {
          mark: { type: 'rule', strokeDash: [6, 4], strokeWidth: 2 },
          encoding: {
            x: { ...x, field: 'rate' },
            color: {
              field: 'name',
              type: 'nominal',
              title: null,
              scale: {
                domain: ['Highest yield', 'Best return over seed'],
                range: [theme.agronomicOptimum, theme.economicOptimum],
              },
              legend: { orient: 'bottom', direction: 'vertical', labelLimit: 0 },
            },
          },
        },
      ],
    });
  }
  return {
    $schema: 'https://vega.github.io/schema/vega-lite/v6.json',
    ...(options.title ? { title: options.title } : {}),
    description:
      options.description ??
      'Yield at each seeding rate with the fitted response curve and its optimum rates.',
    width: 'container',
    height: 280 * (options.scale ?? 1),
    autosize: { type: 'fit-x', contains: 'padding' },
    config: chartConfig(theme, options.scale),
    layer: layers,
  };
}

/**
 * Pooled rate means over sites with their 95 % CI (tested against site × rate).
 */
export function pooledMeansSpec(
  input: {
    means: readonly { label: string; mean: number; ciLow: number; ciHigh: number }[];
    yieldUnit: string;
  },
  options: BaseOptions = {},
): ChartSpec {
  return rateMeansSpec(
    { means: input.means, strips: [], yieldUnit: input.yieldUnit },
    {
      ...options,
      description:
        options.description ??
        `Mean yield (${input.yieldUnit}) at each seeding rate over all sites, with its 95 % confidence interval (tested against site × rate).`,
    },
  );
}
