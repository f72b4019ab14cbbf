import type { TerrainVisibility } from '../map/TerrainOverlay';
import { TERRAIN_COLOURS } from '../map/terrain-layers';

type Props = { visible: TerrainVisibility; onChange: (next: TerrainVisibility) => void };

const ROWS: { key: keyof TerrainVisibility; label: string; swatch: React.CSSProperties }[] = [
  { key: 'drainage', label: 'Drainage lines', swatch: { background: TERRAIN_COLOURS.drainage, height: 4 } },
  { key: 'contours', label: 'Contours', swatch: { background: TERRAIN_COLOURS.contour, height: 2 } },
  { key: 'hillshade', label: 'Hillshade', swatch: { background: 'linear-gradient(90deg, #555, #eee)', height: 10 } },
];

/** The map's legend, each entry also a switch for its layer. */
export default function LayerToggles({ visible, onChange }: Props) {
  return (
    <fieldset className="absolute left-2 top-2 z-10 rounded-lg border border-sand-300 bg-white/95 px-3 py-2 text-sm shadow-sm" aria-label="Map layers">
      <legend className="sr-only">Map layers</legend>
      {ROWS.map((row) => (
        <label key={row.key} className="flex min-h-9 cursor-pointer items-center gap-2">
          <input type="checkbox" className="h-4 w-4" checked={visible[row.key]} onChange={(e) => onChange({ ...visible, [row.key]: e.target.checked })} />
          <span aria-hidden="true" className="inline-block w-6 rounded-sm" style={row.swatch} />
          {row.label}
        </label>
      ))}
    </fieldset>
  );
}
