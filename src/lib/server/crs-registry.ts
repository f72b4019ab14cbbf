import { readFileSync } from 'node:fs';
import { createRequire } from 'node:module';
import path from 'node:path';
import { ValidationError } from './http';

export type CrsDefinition = { code: string; name: string; kind: string; proj4: string; unit: string };

const require = createRequire(import.meta.url);
const registryDir = path.join(path.dirname(require.resolve('epsg-index/package.json')), 's');

/** Looks a code such as "EPSG:7854" up in the EPSG registry (epsg-index); undefined when unknown. */
export function lookupCrs(code: string): CrsDefinition | undefined {
  const match = /^EPSG:(\d{4,6})$/.exec(code);
  if (!match) return undefined;
  try {
    const entry = JSON.parse(readFileSync(path.join(registryDir, `${match[1]}.json`), 'utf8')) as CrsDefinition;
    return entry.proj4 ? { ...entry, code } : undefined;
  } catch {
    return undefined;
  }
}

/**
 * Checks that a code names a projected CRS in metres, which the raster work needs.
 * @throws ValidationError naming the field `crs`
 */
export function requireProjectedCrs(code: string): CrsDefinition {
  const crs = lookupCrs(code);
  if (!crs) throw new ValidationError({ crs: `${code} is not in the EPSG registry. Check the code (for example EPSG:7854 for GDA2020 / MGA zone 54).` });
  if (crs.kind !== 'CRS-PROJCRS' || crs.unit !== 'metre') {
    throw new ValidationError({ crs: `${code} (${crs.name}) is not a projected coordinate system in metres. Choose a map grid such as a UTM or MGA zone.` });
  }
  return crs;
}
