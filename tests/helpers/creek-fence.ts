// Fences constructed in a test at a chosen angle to the drainage line the map shows, near a point
// of the demo generator's creek centreline (data-samples/saltbush-rise.json).
import { readFileSync } from 'node:fs';
import type { Page } from 'playwright-core';
import { createToWgs84 } from '../../src/lib/geo/reproject';
import { lookupCrs } from '../../src/lib/server/crs-registry';

export type LonLat = [number, number];
const manifest = JSON.parse(readFileSync('data-samples/saltbush-rise.json', 'utf8')) as {
  crs: string;
  creeks: { id: string; centrelineXY: [number, number][] }[];
};
const toWgs84 = createToWgs84(lookupCrs(manifest.crs)!.proj4);
export const mainCreekPoint = (index: number): LonLat => toWgs84(manifest.creeks.find((c) => c.id === 'main-creek')!.centrelineXY[index]!);

// Local flat-earth metres about a point: good to well under 0.1° over a few hundred metres.
const metresPerDegree = (lat: number) => ({ x: 111_320 * Math.cos((lat * Math.PI) / 180), y: 110_574 });

/**
 * A straight fence `lengthM` long through the middle of the drainage-line segment nearest `near`,
 * at `angleDeg` to that segment's direction (drainage lines run downstream).
 */
export function fenceAcrossSegment(lines: LonLat[][], near: LonLat, angleDeg: number, lengthM = 300): { ends: [LonLat, LonLat]; middle: LonLat } {
  const k = metresPerDegree(near[1]);
  let best: { a: LonLat; b: LonLat; d: number } | null = null;
  for (const line of lines) {
    for (let i = 1; i < line.length; i += 1) {
      const a = line[i - 1]!;
      const b = line[i]!;
      const mid = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
      const d = Math.hypot((mid[0]! - near[0]) * k.x, (mid[1]! - near[1]) * k.y);
      if (!best || d < best.d) best = { a, b, d };
    }
  }
  const { a, b } = best!;
  const middle: LonLat = [(a[0] + b[0]) / 2, (a[1] + b[1]) / 2];
  const heading = Math.atan2((b[1] - a[1]) * k.y, (b[0] - a[0]) * k.x) + (angleDeg * Math.PI) / 180;
  const end = (sign: number): LonLat => [middle[0] + (sign * (lengthM / 2) * Math.cos(heading)) / k.x, middle[1] + (sign * (lengthM / 2) * Math.sin(heading)) / k.y];
  return { ends: [end(-1), end(1)], middle };
}

export async function drainageLines(page: Page, propertyId: number): Promise<LonLat[][]> {
  return page.evaluate(async (id) => {
    const collection = (await (await fetch(`/api/properties/${id}/drainage-lines`)).json()) as { features: { geometry: { coordinates: [number, number][] } }[] };
    return collection.features.map((feature) => feature.geometry.coordinates);
  }, propertyId);
}

export const propertyIdOf = (page: Page) => Number(new URL(page.url()).pathname.split('/').at(-1));

/**
 * Frames the points on the map, clear of the map key (top left) and the edit toolbar (top right),
 * and returns where they are on the page.
 */
export async function framePoints(page: Page, points: LonLat[]): Promise<{ x: number; y: number }[]> {
  const onScreen = await page.evaluate(async (lonLats) => {
    const map = window.__gullylineMap!;
    const lons = lonLats.map((p) => p[0]);
    const lats = lonLats.map((p) => p[1]);
    map.fitBounds([Math.min(...lons), Math.min(...lats), Math.max(...lons), Math.max(...lats)], { padding: { top: 280, left: 300, right: 80, bottom: 60 }, duration: 0 });
    await new Promise((resolve) => map.once('idle', resolve));
    return lonLats.map((p) => map.project(p as [number, number]));
  }, points);
  const box = (await page.locator('[data-testid=property-map] canvas').boundingBox())!;
  return onScreen.map((p) => ({ x: box.x + p.x, y: box.y + p.y }));
}
