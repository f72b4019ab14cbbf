import type { DesignedCrossingView } from '../../../lib/schemas/crossing-view';
import { PLAN_COLOURS } from '../../map/plan-layers';
import { formatChainage, formatMetres } from './format';

// The sketch's drawing size in SVG units; it scales to the card's width.
const PROFILE_W = 320;
const PROFILE_H = 130;

/** The ground along the fence around the crossing, with the design flood and the end strainers. */
export function ProfileSketch({ design }: { design: DesignedCrossingView }) {
  const { layout } = design;
  const known = (design.profile ?? []).filter((point): point is { chainageM: number; elevationM: number } => point.elevationM !== null);
  if (known.length < 2) return null;
  // Frame the span between the flex-run ends (or the end strainers), with a margin.
  const [startStrainer, endStrainer] = layout.endStrainers;
  const margin = Math.max(10, (endStrainer.chainageM - startStrainer.chainageM) * 0.25);
  const fromM = Math.max(known[0]!.chainageM, startStrainer.chainageM - margin);
  const toM = Math.min(known[known.length - 1]!.chainageM, endStrainer.chainageM + margin);
  const shown = known.filter((point) => point.chainageM >= fromM && point.chainageM <= toM);
  if (shown.length < 2) return null;
  const lowM = Math.min(...shown.map((point) => point.elevationM));
  const highM = Math.max(layout.designLevelM, ...shown.map((point) => point.elevationM));
  const padM = Math.max(0.2, (highM - lowM) * 0.15);
  const x = (chainageM: number) => ((chainageM - fromM) / (toM - fromM || 1)) * PROFILE_W;
  const y = (elevationM: number) => PROFILE_H - 14 - ((elevationM - lowM + padM) / (highM - lowM + 2 * padM)) * (PROFILE_H - 20);
  const ground = shown.map((point) => `${x(point.chainageM).toFixed(1)},${y(point.elevationM).toFixed(1)}`).join(' ');
  const water = shown.filter((point) => point.chainageM >= layout.wetZone.startChainageM && point.chainageM <= layout.wetZone.endChainageM);
  const waterPath =
    water.length > 1
      ? `M${x(water[0]!.chainageM)},${y(layout.floodLevelM)} ` +
        water.map((point) => `L${x(point.chainageM).toFixed(1)},${Math.max(y(point.elevationM), y(layout.floodLevelM)).toFixed(1)}`).join(' ') +
        ` L${x(water[water.length - 1]!.chainageM)},${y(layout.floodLevelM)} Z`
      : null;
  return (
    <figure className="mt-4">
      <svg viewBox={`0 0 ${PROFILE_W} ${PROFILE_H}`} className="h-auto w-full rounded-lg border border-sand-300 bg-white" role="img" aria-label="Ground along the fence with the design flood">
        {waterPath && <path d={waterPath} fill={PLAN_COLOURS.floodgate} fillOpacity="0.35" />}
        <line x1="0" x2={PROFILE_W} y1={y(layout.designLevelM)} y2={y(layout.designLevelM)} stroke={PLAN_COLOURS.floodgate} strokeDasharray="5 4" strokeWidth="1.2" />
        <polyline points={`0,${PROFILE_H} ${ground} ${PROFILE_W},${PROFILE_H}`} fill="#e8dcc7" stroke="none" />
        <polyline points={ground} fill="none" stroke="#4a3a2e" strokeWidth="2" />
        {layout.endStrainers.map((strainer) => (
          <rect key={strainer.side} x={x(strainer.chainageM) - 4} y={y(strainer.groundM ?? lowM) - 14} width="8" height="14" fill={PLAN_COLOURS.ink} />
        ))}
        <text x="4" y="12" fontSize="10" fill="#4a3a2e">
          flood + freeboard {formatMetres(layout.designLevelM, 2)}
        </text>
        <text x="4" y={PROFILE_H - 3} fontSize="10" fill="#4a3a2e">
          {formatChainage(fromM)}
        </text>
        <text x={PROFILE_W - 4} y={PROFILE_H - 3} fontSize="10" fill="#4a3a2e" textAnchor="end">
          {formatChainage(toM)}
        </text>
      </svg>
      <figcaption className="mt-1 text-xs text-bark-700">
        Ground along the fence (height exaggerated), the design flood in blue and the end strainers in black.
      </figcaption>
    </figure>
  );
}
