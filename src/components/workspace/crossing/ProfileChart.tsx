import { useMemo, useRef, type ReactNode, type RefObject } from 'react';
import uPlot from 'uplot';
import type { DesignedCrossingView } from '../../../lib/schemas/crossing-view';
import { UPlotChart } from '../../charts/UPlotChart';
import { PLAN_COLOURS } from '../../map/plan-layers';
import { TERRAIN_COLOURS } from '../../map/terrain-layers';
import { MAP_COLOURS } from '../../map/theme';
import { formatMetres } from './format';
import { buildProfileChart, describeProfileChart, formatOffset, type ProfileChartData, type ProfileMark, type ProfileMarkKind } from './profile-chart-data';

/**
 * The chart's colours. Marks take the map's colours (plan-style, terrain-layers) so a post or a
 * tie looks the same on both; ground and text take the page's (global.css).
 */
const COLOURS = {
  /** global.css --color-bark-700 */
  ground: '#4a3a2e',
  /** global.css --color-sand-200 */
  groundFill: '#e8dcc7',
  /** global.css --color-sand-300: grid lines, faint on white and on the ground's fill */
  grid: '#d6c3a0',
  text: MAP_COLOURS.text,
  water: TERRAIN_COLOURS.drainage,
  floodgate: PLAN_COLOURS.floodgate,
  ink: PLAN_COLOURS.ink,
  linePost: PLAN_COLOURS.linePost,
  tie: PLAN_COLOURS.tie,
  casing: MAP_COLOURS.casing,
} as const;

/** `#rrggbb` with an alpha, for canvas fills. */
function withAlpha(hex: string, alpha: number): string {
  const [r, g, b] = [1, 3, 5].map((start) => parseInt(hex.slice(start, start + 2), 16));
  return `rgba(${r}, ${g}, ${b}, ${alpha})`;
}

const WATER_FILL = withAlpha(COLOURS.water, 0.35);
const WET_ZONE_FILL = withAlpha(COLOURS.water, 0.08);
const FLOODGATE_FILL = withAlpha(COLOURS.floodgate, 0.45);
const FONT = '12px "Noto Sans", system-ui, sans-serif';
const LABEL_FONT = '600 12px "Noto Sans", system-ui, sans-serif';

// Series indices (after x; the freeboard line is 2): flood first, so the ground's line is drawn
// over the water's edge.
const FLOOD = 1;
const GROUND = 3;

/** Decimals for a height axis step: 0.5 m steps want one, 0.05 m steps two. */
const decimalsFor = (stepM: number) => (stepM >= 1 ? 0 : stepM >= 0.1 ? 1 : 2);

/** The ground along the fence around the crossing: flood, wet zone, floodgate, end strainers, posts and tie. */
export function ProfileChart({ design, crossingChainageM, fenceName }: { design: DesignedCrossingView; crossingChainageM: number; fenceName: string }) {
  const readoutRef = useRef<HTMLParagraphElement>(null);
  const chart = useMemo(() => buildProfileChart(design, crossingChainageM), [design, crossingChainageM]);
  const data = useMemo<uPlot.AlignedData | null>(() => chart && [chart.xM, chart.floodM, chart.designM, chart.groundM], [chart]);
  const options = useMemo(() => chart && chartOptions(chart, readoutRef), [chart]);
  if (!chart || !data || !options) return null;
  const label = describeProfileChart(chart, fenceName);
  return (
    <figure className="mt-4" data-testid="profile-chart">
      <UPlotChart
        options={options}
        data={data}
        height={(widthPx) => (widthPx < 360 ? 220 : 250)}
        label={label}
        className="w-full overflow-x-auto rounded-lg border border-sand-300 bg-white pt-1"
      />
      <p ref={readoutRef} aria-hidden="true" className="mt-1 min-h-4 text-xs tabular-nums text-bark-700" data-testid="profile-readout" />
      <ProfileKey chart={chart} />
      <figcaption className="mt-1 text-xs text-bark-700">
        Ground along the fence, in metres from the crossing; heights are exaggerated to show the channel.
      </figcaption>
      <ProfileTable chart={chart} />
    </figure>
  );
}

function chartOptions(chart: ProfileChartData, readoutRef: RefObject<HTMLParagraphElement | null>): Omit<uPlot.Options, 'width' | 'height'> {
  const [yMin] = chart.yRangeM;
  return {
    legend: { show: false },
    // A vertical hair for reading heights; no zooming, the frame is already the crossing's.
    cursor: { y: false, points: { show: false }, drag: { x: false, y: false, setScale: false } },
    padding: [6, 14, 0, 0],
    scales: {
      x: { time: false, range: chart.xRangeM },
      y: { range: chart.yRangeM },
    },
    axes: [
      {
        label: 'From the crossing (m)',
        font: FONT,
        labelFont: LABEL_FONT,
        labelSize: 18,
        size: 30,
        stroke: COLOURS.text,
        grid: { stroke: COLOURS.grid, width: 1 },
        ticks: { stroke: COLOURS.grid, width: 1, size: 4 },
        values: (_u, splits) => splits.map((value) => formatOffset(value, '')),
      },
      {
        label: 'Height (m)',
        font: FONT,
        labelFont: LABEL_FONT,
        labelSize: 18,
        size: 46,
        gap: 4,
        stroke: COLOURS.text,
        grid: { stroke: COLOURS.grid, width: 1 },
        ticks: { stroke: COLOURS.grid, width: 1, size: 4 },
        values: (_u, splits, _axis, _space, stepM) => splits.map((value) => value.toFixed(decimalsFor(stepM))),
      },
    ],
    series: [
      {},
      { label: 'Design flood level', stroke: COLOURS.water, width: 2 },
      { label: 'Flood level and freeboard', stroke: COLOURS.water, width: 1.5, dash: [6, 4] },
      { label: 'Ground', stroke: COLOURS.ground, width: 2.5, fill: COLOURS.groundFill, fillTo: () => yMin },
    ],
    // The water: from the flood level down to the ground, where the ground lies below it.
    bands: [{ series: [FLOOD, GROUND], fill: WATER_FILL }],
    hooks: {
      drawClear: [(u) => drawWetZone(u, chart)],
      draw: [(u) => drawFloodgate(u, chart), (u) => drawMarks(u, chart.marks)],
      setCursor: [(u) => showReadout(u, chart, readoutRef.current)],
    },
  };
}

/** The wet zone as a pale strip the height of the plot, behind the grid. */
function drawWetZone(u: uPlot, chart: ProfileChartData): void {
  const left = u.valToPos(chart.wetZoneM[0], 'x', true);
  const right = u.valToPos(chart.wetZoneM[1], 'x', true);
  const { ctx, bbox } = u;
  ctx.save();
  ctx.fillStyle = WET_ZONE_FILL;
  ctx.fillRect(left, bbox.top, right - left, bbox.height);
  ctx.restore();
}

/** The floodgate's stretch as a bar along the top of the plot, like the map's band, with end ticks. */
function drawFloodgate(u: uPlot, chart: ProfileChartData): void {
  if (!chart.floodgateM) return;
  const px = uPlot.pxRatio;
  const left = u.valToPos(chart.floodgateM[0], 'x', true);
  const right = u.valToPos(chart.floodgateM[1], 'x', true);
  const y = u.bbox.top + 8 * px;
  const { ctx } = u;
  ctx.save();
  ctx.fillStyle = FLOODGATE_FILL;
  ctx.fillRect(left, y - 4 * px, right - left, 8 * px);
  ctx.strokeStyle = COLOURS.floodgate;
  ctx.lineWidth = 2 * px;
  for (const x of [left, right]) {
    ctx.beginPath();
    ctx.moveTo(x, y - 6 * px);
    ctx.lineTo(x, y + 6 * px);
    ctx.stroke();
  }
  ctx.restore();
}

/** The layout's marks on the ground, in the map's symbols: squares, dots, ringed dots, a diamond. */
function drawMarks(u: uPlot, marks: ProfileMark[]): void {
  const px = uPlot.pxRatio;
  const { ctx } = u;
  ctx.save();
  // Posts first, then strainers, then the tie, so the rarer marks are never hidden.
  const order: Record<ProfileMarkKind, number> = { post: 0, 'stayed-post': 1, 'end-strainer': 2, 'breakaway-tie': 3 };
  for (const mark of [...marks].sort((a, b) => order[a.kind] - order[b.kind])) {
    if (mark.groundM === null) continue;
    const x = u.valToPos(mark.xM, 'x', true);
    const y = u.valToPos(mark.groundM, 'y', true);
    drawMark(ctx, mark, x, y, px);
  }
  ctx.restore();
}

function drawMark(ctx: CanvasRenderingContext2D, mark: Pick<ProfileMark, 'kind' | 'inFloodgate'>, x: number, y: number, px: number): void {
  ctx.lineJoin = 'miter';
  switch (mark.kind) {
    case 'end-strainer': {
      // Standing on the ground: a dark square with a pale rim, as on the map.
      const side = 12 * px;
      ctx.fillStyle = COLOURS.casing;
      ctx.fillRect(x - side / 2 - 2 * px, y - side - 2 * px, side + 4 * px, side + 4 * px);
      ctx.fillStyle = COLOURS.ink;
      ctx.fillRect(x - side / 2, y - side, side, side);
      return;
    }
    case 'post':
    case 'stayed-post': {
      const stayed = mark.kind === 'stayed-post';
      const radius = (stayed ? 5 : 3.5) * px;
      ctx.beginPath();
      ctx.arc(x, y, radius + (stayed ? 2.5 : 1.5) * px, 0, Math.PI * 2);
      ctx.fillStyle = COLOURS.casing;
      ctx.fill();
      ctx.beginPath();
      ctx.arc(x, y, radius, 0, Math.PI * 2);
      ctx.fillStyle = mark.inFloodgate ? COLOURS.ink : COLOURS.linePost;
      ctx.fill();
      if (stayed) {
        // A stayed post carries an outer ring, so it reads without comparing sizes.
        ctx.beginPath();
        ctx.arc(x, y, radius + 4 * px, 0, Math.PI * 2);
        ctx.strokeStyle = COLOURS.ink;
        ctx.lineWidth = 1.5 * px;
        ctx.stroke();
      }
      return;
    }
    case 'breakaway-tie': {
      // Above its post, so both show: a diamond in the tie's colour with a dark edge.
      const half = 7 * px;
      const cy = y - 18 * px;
      ctx.beginPath();
      ctx.moveTo(x, cy - half);
      ctx.lineTo(x + half, cy);
      ctx.lineTo(x, cy + half);
      ctx.lineTo(x - half, cy);
      ctx.closePath();
      ctx.fillStyle = COLOURS.tie;
      ctx.strokeStyle = COLOURS.ink;
      ctx.lineWidth = 1.5 * px;
      ctx.fill();
      ctx.stroke();
      ctx.beginPath();
      ctx.moveTo(x, cy + half);
      ctx.lineTo(x, y - 6 * px);
      ctx.stroke();
    }
  }
}

/** Where the hair is: distance from the crossing, ground height and water depth. */
function showReadout(u: uPlot, chart: ProfileChartData, element: HTMLElement | null): void {
  if (!element) return;
  const idx = u.cursor.idx;
  if (idx === null || idx === undefined) {
    element.textContent = '';
    return;
  }
  const groundM = chart.groundM[idx];
  const floodM = chart.floodM[idx];
  const parts = [`${formatOffset(chart.xM[idx]!)} from the crossing`, groundM === null || groundM === undefined ? 'ground unknown' : `ground ${formatMetres(groundM, 2)}`];
  if (floodM !== null && floodM !== undefined && groundM !== null && groundM !== undefined) parts.push(`water ${formatMetres(floodM - groundM, 2)} deep`);
  element.textContent = parts.join(' · ');
}

/** The chart's key: only the entries this crossing has, each with the mark as the chart draws it. */
function ProfileKey({ chart }: { chart: ProfileChartData }) {
  const has = (test: (mark: ProfileMark) => boolean) => chart.marks.some(test);
  const entries: [string, ReactNode][] = [
    ['Ground', <line key="g" x1="1" y1="7" x2="23" y2="7" stroke={COLOURS.ground} strokeWidth="2.5" />],
    [
      'Design flood',
      <g key="f">
        <rect x="1" y="6" width="22" height="7" fill={WATER_FILL} />
        <line x1="1" y1="6" x2="23" y2="6" stroke={COLOURS.water} strokeWidth="2" />
      </g>,
    ],
    ['With freeboard', <line key="d" x1="1" y1="7" x2="23" y2="7" stroke={COLOURS.water} strokeWidth="1.5" strokeDasharray="6 4" />],
    ['Wet zone', <rect key="w" x="1" y="1" width="22" height="12" fill={WET_ZONE_FILL} stroke={withAlpha(COLOURS.water, 0.3)} />],
  ];
  if (chart.floodgateM)
    entries.push([
      'Floodgate',
      <g key="fg">
        <rect x="2" y="3" width="20" height="8" fill={FLOODGATE_FILL} />
        <path d="M2 1v12M22 1v12" stroke={COLOURS.floodgate} strokeWidth="2" />
      </g>,
    ]);
  if (has((mark) => mark.kind === 'end-strainer')) entries.push(['End strainer', <SymbolMark key="s" kind="end-strainer" />]);
  if (has((mark) => mark.kind === 'post' && mark.inFloodgate)) entries.push(['Floodgate post', <SymbolMark key="p" kind="post" />]);
  if (has((mark) => mark.kind === 'post' && !mark.inFloodgate)) entries.push(['Line post', <SymbolMark key="l" kind="post" inFloodgate={false} />]);
  if (has((mark) => mark.kind === 'stayed-post')) entries.push(['Stayed post', <SymbolMark key="sp" kind="stayed-post" />]);
  if (has((mark) => mark.kind === 'breakaway-tie')) entries.push(['Breakaway tie', <SymbolMark key="t" kind="breakaway-tie" />]);
  return (
    <ul aria-hidden="true" className="mt-1 flex flex-wrap gap-x-3 gap-y-1 text-xs text-bark-900">
      {entries.map(([name, symbol]) => (
        <li key={name} className="flex items-center gap-1">
          <svg width="24" height="14" viewBox="0 0 24 14" className="shrink-0">
            {symbol}
          </svg>
          {name}
        </li>
      ))}
    </ul>
  );
}

/** One mark in the key, drawn as on the chart (SVG here, canvas there; same sizes and colours). */
function SymbolMark({ kind, inFloodgate = true }: { kind: ProfileMarkKind; inFloodgate?: boolean }) {
  switch (kind) {
    case 'end-strainer':
      return <rect x="6" y="1" width="12" height="12" fill={COLOURS.ink} />;
    case 'post':
      return <circle cx="12" cy="7" r="3.5" fill={inFloodgate ? COLOURS.ink : COLOURS.linePost} />;
    case 'stayed-post':
      return (
        <g>
          <circle cx="12" cy="7" r="4" fill={COLOURS.ink} />
          <circle cx="12" cy="7" r="6.25" fill="none" stroke={COLOURS.ink} strokeWidth="1.5" />
        </g>
      );
    case 'breakaway-tie':
      return <path d="M12 1l6 6-6 6-6-6z" fill={COLOURS.tie} stroke={COLOURS.ink} strokeWidth="1.5" />;
  }
}

/** The chart's figures as a table for screen readers. */
function ProfileTable({ chart }: { chart: ProfileChartData }) {
  const count = (kind: ProfileMarkKind) => chart.marks.filter((mark) => mark.kind === kind).length;
  const height = (heightM: number | null) => (heightM === null ? 'unknown' : formatMetres(heightM, 2));
  const [start, end] = chart.marks.filter((mark) => mark.kind === 'end-strainer');
  const rows: [string, string, string][] = [
    ['Design flood level', `${formatMetres(chart.floodWidthM, 0)} wide along the fence`, formatMetres(chart.floodLevelM, 2)],
    ['With freeboard, the wet zone', `${formatOffset(chart.wetZoneM[0])} to ${formatOffset(chart.wetZoneM[1])}`, formatMetres(chart.designLevelM, 2)],
  ];
  if (chart.floodgateM) rows.push(['Floodgate', `${formatOffset(chart.floodgateM[0])} to ${formatOffset(chart.floodgateM[1])}`, '']);
  if (start) rows.push(['End strainer, near side', formatOffset(start.xM), height(start.groundM)]);
  if (end) rows.push(['End strainer, far side', formatOffset(end.xM), height(end.groundM)]);
  for (const tie of chart.marks.filter((mark) => mark.kind === 'breakaway-tie')) rows.push(['Breakaway tie', formatOffset(tie.xM), height(tie.groundM)]);
  rows.push(['Posts between', `${count('post') + count('stayed-post')}, of which ${count('stayed-post')} stayed`, '']);
  // Hidden by a wrapper: a table sizes to its content whatever its own width, and would widen the page.
  return (
    <div className="sr-only">
      <table>
        <caption>Figures of the ground profile, in metres from the crossing</caption>
        <thead>
          <tr>
            <th scope="col">What</th>
            <th scope="col">Where</th>
            <th scope="col">Height</th>
          </tr>
        </thead>
        <tbody>
          {rows.map(([what, where, heightText]) => (
            <tr key={what + where}>
              <th scope="row">{what}</th>
              <td>{where}</td>
              <td>{heightText}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
