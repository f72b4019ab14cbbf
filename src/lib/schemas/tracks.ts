/** A line read from a GPX or KML file: shown on the map, and one step away from a fence line. */
export type Track = {
  id: number;
  name: string;
  kind: 'track' | 'route' | 'line';
  sourceFile: string;
  description: string;
  coordinates: [number, number][];
  lengthM: number;
};

/** What an import of a GPX or KML file stored. */
export type TrackImportResult = { format: 'gpx' | 'kml'; tracks: number; paddocks: number; skipped: string[] };
