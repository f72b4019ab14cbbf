import { useState } from 'react';
import { FENCE_STATUS_STYLES, PLAN_COLOURS } from '../map/plan-layers';
import type { TerrainVisibility } from '../map/TerrainOverlay';
import { TERRAIN_COLOURS } from '../map/terrain-layers';
import { TRACK_PADDOCK_COLOURS } from '../map/track-layers';
import type { FenceStatus } from '../../lib/schemas/plan';
import { CrossingSymbol } from './CrossingsPanel';

type Props = {
  visible: TerrainVisibility;
  onChange: (next: TerrainVisibility) => void;
  /** Whether there are terrain layers to switch (a finished terrain run). */
  showTerrain: boolean;
  /** Fence statuses on the map, in the order they are listed. */
  fenceStatuses: FenceStatus[];
  /** Whether crossings are on the map. */
  showCrossings: boolean;
  /** Whether a suggested realignment is drawn. */
  showRealignment: boolean;
  /** Tracks and paddocks: switches shown only when there are some. */
  planVisible: PlanVisibility;
  onPlanChange: (next: PlanVisibility) => void;
  showTracks: boolean;
  showPaddocks: boolean;
};

export type PlanVisibility = { tracks: boolean; paddocks: boolean };

const PLAN_ROWS: { key: keyof PlanVisibility; label: string; swatch: React.CSSProperties }[] = [
  { key: 'tracks', label: 'GPS tracks', swatch: { backgroundImage: `radial-gradient(circle, ${TRACK_PADDOCK_COLOURS.track} 45%, transparent 50%)`, backgroundSize: '6px 6px', height: 6 } },
  { key: 'paddocks', label: 'Paddocks', swatch: { background: `${TRACK_PADDOCK_COLOURS.paddockFill}40`, border: `2px solid ${TRACK_PADDOCK_COLOURS.paddockEdge}`, height: 12 } },
];

const ROWS: { key: keyof TerrainVisibility; label: string; swatch: React.CSSProperties }[] = [
  { key: 'drainage', label: 'Drainage lines', swatch: { background: TERRAIN_COLOURS.drainage, height: 4 } },
  { key: 'contours', label: 'Contours', swatch: { background: TERRAIN_COLOURS.contour, height: 2 } },
  { key: 'hillshade', label: 'Hillshade', swatch: { background: 'linear-gradient(90deg, #555, #eee)', height: 10 } },
];

/** A fence line's dash pattern as the map draws it, 28 px long. */
function FenceSwatch({ status }: { status: FenceStatus }) {
  const style = FENCE_STATUS_STYLES[status];
  const width = 3;
  return (
    <svg aria-hidden="true" width="28" height="10" viewBox="0 0 28 10" className="shrink-0">
      <line x1="0" y1="5" x2="28" y2="5" stroke="#fbf7ee" strokeWidth={width + 3} />
      <line
        x1="0"
        y1="5"
        x2="28"
        y2="5"
        stroke={style.colour}
        strokeWidth={width}
        strokeDasharray={style.dash.length ? style.dash.map((d) => d * width).join(' ') : undefined}
      />
    </svg>
  );
}

type SwitchRow<K extends string> = { key: K; label: string; swatch: React.CSSProperties };

/** Checkboxes that show or hide layers, each with its swatch. */
function SwitchRows<K extends string>({ label, rows, visible, onChange }: { label: string; rows: SwitchRow<K>[]; visible: Record<K, boolean>; onChange: (next: Record<K, boolean>) => void }) {
  return (
    <fieldset aria-label={label}>
      <legend className="sr-only">{label}</legend>
      {rows.map((row) => (
        <label key={row.key} className="flex min-h-11 cursor-pointer items-center gap-2">
          <input type="checkbox" className="h-5 w-5" checked={visible[row.key]} onChange={(e) => onChange({ ...visible, [row.key]: e.target.checked })} />
          <span aria-hidden="true" className="inline-block w-6 rounded-sm" style={row.swatch} />
          {row.label}
        </label>
      ))}
    </fieldset>
  );
}

/** Open on a wide screen; on a phone the key starts folded so it does not cover the map. */
const startsOpen = () => typeof window === 'undefined' || window.matchMedia('(min-width: 768px)').matches;

/** The map's key: the terrain entries are also switches for their layers; the plan's are a key only. */
export default function LayerToggles({ visible, onChange, showTerrain, fenceStatuses, showCrossings, showRealignment, planVisible, onPlanChange, showTracks, showPaddocks }: Props) {
  const planRows = PLAN_ROWS.filter((row) => (row.key === 'tracks' ? showTracks : showPaddocks));
  const [open, setOpen] = useState(startsOpen);
  return (
    <details
      open={open}
      onToggle={(event) => setOpen(event.currentTarget.open)}
      className="absolute left-2 top-2 z-10 max-h-[calc(100%-4rem)] max-w-[15rem] overflow-y-auto rounded-lg border border-sand-300 bg-white/95 text-sm shadow-sm"
    >
      <summary className="flex min-h-11 cursor-pointer items-center px-3 font-semibold text-bark-900">Map key</summary>
      <div className="flex flex-col gap-2 px-3 pb-2">
        {showTerrain && <SwitchRows label="Map layers" rows={ROWS} visible={visible} onChange={onChange} />}
        {planRows.length > 0 && <SwitchRows label="Plan layers" rows={planRows} visible={planVisible} onChange={onPlanChange} />}
        {fenceStatuses.length > 0 && (
          <div>
            <p className="font-semibold text-bark-700">Fence lines</p>
            <ul className="mt-1 flex flex-col gap-1">
              {fenceStatuses.map((status) => (
                <li key={status} className="flex items-center gap-2">
                  <FenceSwatch status={status} />
                  {FENCE_STATUS_STYLES[status].label}
                </li>
              ))}
            </ul>
          </div>
        )}
        {showCrossings && (
          <div>
            <p className="font-semibold text-bark-700">Crossing angle</p>
            <ul className="mt-1 flex flex-col gap-1">
              <li className="flex items-center gap-2">
                <CrossingSymbol angleClass="good" designed />
                Good (near square)
              </li>
              <li className="flex items-center gap-2">
                <CrossingSymbol angleClass="fair" designed />
                Fair
              </li>
              <li className="flex items-center gap-2">
                <CrossingSymbol angleClass="poor" designed />
                Poor (oblique)
              </li>
              <li className="flex items-center gap-2">
                <CrossingSymbol angleClass="fair" designed={false} />
                Hollow: no design (open it for why)
              </li>
              <li className="flex items-center gap-2">
                <svg aria-hidden="true" width="24" height="24" viewBox="0 0 24 24" className="shrink-0">
                  <circle cx="12" cy="12" r="10" fill="none" stroke={PLAN_COLOURS.redesign} strokeWidth="3" />
                  <circle cx="12" cy="12" r="5" fill={PLAN_COLOURS.angle.good} stroke={PLAN_COLOURS.casing} strokeWidth="1.5" />
                </svg>
                Wide outer ring: failed in two floods, reconsider its style
              </li>
            </ul>
          </div>
        )}
        {showRealignment && (
          <p className="flex items-center gap-2">
            <svg aria-hidden="true" width="28" height="10" viewBox="0 0 28 10" className="shrink-0">
              <line x1="0" y1="5" x2="28" y2="5" stroke="#fbf7ee" strokeWidth="6" />
              <line x1="0" y1="5" x2="28" y2="5" stroke={PLAN_COLOURS.realign} strokeWidth="3.5" strokeDasharray="5 3.5" />
            </svg>
            Suggested realignment
          </p>
        )}
      </div>
    </details>
  );
}
