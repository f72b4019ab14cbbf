// Two ways to build each crossing, through the API, on the demo property: the comparison, the
// planner's choice of style, and the style carried into the materials and the exports.
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeServerDb, signedInClient, type TestClient } from '../helpers/api-client';
import { loadDemoPlan } from '../helpers/demo-plan';

type Summary = { id: number; fenceLineId: number; kind: string; designStatus: string; style: string | null; computedAt: string };
type Side = { style: string; inPlan: boolean; counts: { endAssemblies: number; flexRunStrainers: number; breakawayTies: number }; wiresRunThrough: boolean; cost?: { totalCents: number; complete: boolean } };
type Detail = Summary & {
  inputs: Record<string, unknown>;
  design: {
    status: string;
    provisional: boolean;
    layout: { style: string; endStrainers: { onDryGround: boolean }[]; styleDetail: { wiresRunThrough: boolean; flexRunEachSideM: number } };
    materials: { items: { code: string; quantity: number }[] };
    styleChoice: { style: string; chosenBy: string; recommended: string };
    comparison: { inPlan: string; chosenBy: string; sides: Side[]; recommendation: { style: string; reasons: string[] }; release: { reasons: string[] } | null };
  };
};

const manifest = JSON.parse(readFileSync('data-samples/saltbush-rise.json', 'utf8')) as { fenceLines: { name: string; pointsLonLat: [number, number][]; crossing: { pointLonLat: [number, number] } }[] };

let manager: TestClient;
let propertyId = 0;
let fenceIds = new Map<string, number>();
const metresBetween = ([lon1, lat1]: [number, number], [lon2, lat2]: [number, number]) => Math.hypot((lon2 - lon1) * 111_320 * Math.cos((lat1 * Math.PI) / 180), (lat2 - lat1) * 110_900);

async function features() {
  return (await manager.json<{ features: { properties: Summary; geometry: { coordinates: [number, number] } }[] }>('GET', `/api/properties/${propertyId}/crossings`)).body.features;
}
const detail = async (id: number) => (await manager.json<{ crossing: Detail }>('GET', `/api/properties/${propertyId}/crossings/${id}`)).body.crossing;
async function constructedId(name: string): Promise<number> {
  const target = manifest.fenceLines.find((f) => f.name === name)!.crossing.pointLonLat;
  const own = (await features()).filter((f) => f.properties.fenceLineId === fenceIds.get(name) && f.properties.kind !== 'runs-along');
  return own.reduce((a, b) => (metresBetween(b.geometry.coordinates, target) < metresBetween(a.geometry.coordinates, target) ? b : a)).properties.id;
}
const qty = (d: Detail, code: string) => d.design.materials.items.filter((it) => it.code === code).reduce((s, it) => s + it.quantity, 0);

beforeAll(async () => {
  manager = (await signedInClient('styles-manager')).client;
  ({ propertyId, fenceIds } = await loadDemoPlan(manager, 'Saltbush Rise (styles)'));
}, 120_000);
afterAll(closeServerDb);

describe('two ways to build each crossing', () => {
  it('compares both styles on every designed crossing, priced from the price list, the one in the plan being the design', async () => {
    const designed = (await features()).filter((f) => f.properties.designStatus === 'designed');
    expect(designed.length).toBeGreaterThanOrEqual(manifest.fenceLines.length);
    for (const { properties } of designed) {
      const { design, style } = await detail(properties.id);
      const { comparison } = design;
      expect(comparison.sides.map((s) => s.style)).toEqual(['continuous-floodgate', 'drop-down-section']);
      expect(comparison.inPlan).toBe(design.layout.style);
      expect(style).toBe(design.layout.style);
      expect(comparison.sides.filter((s) => s.inPlan).map((s) => s.style)).toEqual([design.layout.style]);
      expect(comparison.sides.map((s) => s.wiresRunThrough)).toEqual([true, false]);
      expect(comparison.sides.map((s) => s.counts.flexRunStrainers)).toEqual([2, 0]);
      for (const side of comparison.sides) expect(side.cost?.totalCents).toBeGreaterThan(0);
      expect(comparison.recommendation.reasons.length).toBeGreaterThan(0);
      // An end assembly not proven dry (the flood runs past the model's edge) makes the design provisional, and says so.
      expect(design.layout.endStrainers.every((s) => s.onDryGround) || design.provisional).toBe(true);
    }
    for (const fence of manifest.fenceLines) {
      const { design } = await detail(await constructedId(fence.name));
      expect(design.layout.endStrainers.every((s) => s.onDryGround), fence.name).toBe(true);
    }
  });

  it('builds it the other way when the planner chooses: the plan, the materials, the list and the GeoJSON follow', async () => {
    const id = await constructedId('South cross fence');
    const before = await detail(id);
    const other = before.design.comparison.sides.find((s) => !s.inPlan)!.style;
    const { status, body } = await manager.json<{ crossing: Detail }>('PATCH', `/api/properties/${propertyId}/crossings/${id}`, { style: other });
    expect(status).toBe(200);
    const after = body.crossing;
    expect(after.design.layout.style).toBe(other);
    expect(after.design.comparison.inPlan).toBe(other);
    expect(after.design.styleChoice.chosenBy).toBe('planner');
    expect(after.design.comparison.sides.find((s) => s.inPlan)?.style).toBe(other);
    // Two flex-run strainers more for the continuous floodgate, two end-assembly ties more for the section.
    const strainers = other === 'drop-down-section' ? -2 : 2;
    expect(qty(after, 'STRAINER_ASSEMBLY') - qty(before, 'STRAINER_ASSEMBLY')).toBe(strainers);
    expect(qty(after, 'BREAKAWAY_TIE') - qty(before, 'BREAKAWAY_TIE')).toBe(-strainers);
    expect((await features()).find((f) => f.properties.id === id)?.properties.style).toBe(other);

    const geojson = (await (await manager.request('GET', `/api/properties/${propertyId}/exports/plan.geojson`)).json()) as { features: { properties: { featureType: string; id: number; style: string | null } }[] };
    expect(geojson.features.find((f) => f.properties.featureType === 'crossing' && f.properties.id === id)?.properties.style).toBe(other);
    const gpx = await (await manager.request('GET', `/api/properties/${propertyId}/exports/waypoints.gpx`)).text();
    expect(gpx).toContain(`built as a ${other === 'drop-down-section' ? 'drop-down section' : 'continuous floodgate'}`);

    // Clearing the choice hands the style back to the rule.
    const cleared = (await manager.json<{ crossing: Detail }>('PATCH', `/api/properties/${propertyId}/crossings/${id}`, { style: null })).body.crossing;
    expect(cleared.design.styleChoice.chosenBy).toBe('rule');
    expect(cleared.design.layout.style).toBe(cleared.design.styleChoice.recommended);
  });

  it('recommends the drop-down section once heavy debris is expected at a crossing', async () => {
    const id = await constructedId('North cross fence');
    const { body } = await manager.json<{ crossing: Detail }>('PATCH', `/api/properties/${propertyId}/crossings/${id}`, { debris: 'heavy' });
    expect(body.crossing.inputs.debris).toBe('heavy');
    expect(body.crossing.design.comparison.recommendation.style).toBe('drop-down-section');
    expect(body.crossing.design.layout.style).toBe('drop-down-section');
    expect(body.crossing.design.comparison.recommendation.reasons.join(' ')).toMatch(/heavy debris/);
  });

  it.each([
    ['an unknown style', { style: 'zigzag' }, 'style', /continuous-floodgate' or 'drop-down-section/],
    ['an unknown debris level', { debris: 'lots' }, 'debris', /'light', 'moderate' or 'heavy'/],
  ])('refuses %s with 422 and changes nothing', async (_label, change, field, message) => {
    const id = await constructedId('East paddock fence');
    const before = await detail(id);
    const answer = await manager.json<{ fields: Record<string, string> }>('PATCH', `/api/properties/${propertyId}/crossings/${id}`, change);
    expect(answer.status).toBe(422);
    expect(answer.body.fields[field]).toMatch(message);
    expect(await detail(id)).toEqual(before);
  });
});
