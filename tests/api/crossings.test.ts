// The demo scenario end to end: terrain run → fence lines → crossings → designs, through the API.
import { readFileSync } from 'node:fs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { closeServerDb, rowCounts, signedInClient, type TestClient } from '../helpers/api-client';
import { loadDemoPlan } from '../helpers/demo-plan';

type Summary = { id: number; fenceLineId: number; fenceName: string; kind: string; angleDeg: number; angleClass: string; designStatus: string; provisional: boolean; chainageM: number };
type Feature = { properties: Summary; geometry: { coordinates: [number, number] } };

const manifest = JSON.parse(readFileSync('data-samples/saltbush-rise.json', 'utf8')) as {
  fenceLines: { name: string; pointsLonLat: [number, number][]; crossing: { pointLonLat: [number, number]; constructedAngleDeg: number } }[];
};
const prices = JSON.parse(readFileSync('data-samples/saltbush-rise-prices.json', 'utf8')) as { items: unknown[] };

let manager: TestClient;
let propertyId = 0;
let fenceIds = new Map<string, number>();

const metresBetween = ([lon1, lat1]: [number, number], [lon2, lat2]: [number, number]) =>
  Math.hypot((lon2 - lon1) * 111_320 * Math.cos((lat1 * Math.PI) / 180), (lat2 - lat1) * 110_900);

async function crossings(): Promise<Feature[]> {
  return (await manager.json<{ features: Feature[] }>('GET', `/api/properties/${propertyId}/crossings`)).body.features;
}

/** The crossing found nearest the place the demo generator built the fence across the creek. */
async function constructedCrossing(name: string): Promise<Feature & { offsetM: number }> {
  const target = manifest.fenceLines.find((f) => f.name === name)!.crossing.pointLonLat;
  const own = (await crossings()).filter((f) => f.properties.fenceLineId === fenceIds.get(name) && f.properties.kind !== 'runs-along');
  const nearest = own.reduce((a, b) => (metresBetween(b.geometry.coordinates, target) < metresBetween(a.geometry.coordinates, target) ? b : a));
  return { ...nearest, offsetM: metresBetween(nearest.geometry.coordinates, target) };
}

beforeAll(async () => {
  manager = (await signedInClient('crossings-manager')).client;
  ({ propertyId, fenceIds } = await loadDemoPlan(manager, 'Saltbush Rise (crossings)'));
}, 120_000);
afterAll(closeServerDb);

describe('crossings of the demo subdivision', () => {
  it.each(manifest.fenceLines.map((f) => [f.name, f.crossing.constructedAngleDeg] as const))(
    '%s crosses its creek where it was built, at %i° within 4°',
    async (name, constructedDeg) => {
      const found = await constructedCrossing(name);
      // Drainage lines follow 5 m cell centres and are lightly simplified: within 15 m of the built point.
      expect(found.offsetM).toBeLessThan(15);
      expect(Math.abs(found.properties.angleDeg - constructedDeg)).toBeLessThan(4);
      expect(found.properties.designStatus).toBe('designed');
    },
  );

  it('classifies by the default tolerance: square is good, 60° fair, 35° poor', async () => {
    expect((await constructedCrossing('North cross fence')).properties.angleClass).toBe('good');
    expect((await constructedCrossing('East paddock fence')).properties.angleClass).toBe('fair');
    expect((await constructedCrossing('South cross fence')).properties.angleClass).toBe('poor');
  });

  it('designs each with its end strainers on dry ground and the cautions (rules of thumb: common practice)', async () => {
    for (const fence of manifest.fenceLines) {
      const { id } = (await constructedCrossing(fence.name)).properties;
      const { body } = await manager.json<{ crossing: { design: { layout: { endStrainers: { onDryGround: boolean }[]; wires: { mustBePlain: boolean; kind: string }[] }; cautions: string[]; floods: { chosen: string } } } }>(
        'GET',
        `/api/properties/${propertyId}/crossings/${id}`,
      );
      const { layout, cautions, floods } = body.crossing.design;
      expect(layout.endStrainers.every((s) => s.onDryGround), fence.name).toBe(true);
      expect(layout.wires.filter((w) => w.mustBePlain).every((w) => w.kind === 'plain')).toBe(true);
      expect(cautions.join(' ')).toMatch(/floodwater/i);
      expect(floods.chosen).toBe('rainfall');
    }
  });
});

describe('crossing inputs', () => {
  it('uses a flood mark at once when one is entered, keeping the rainfall figures', async () => {
    const { id } = (await constructedCrossing('North cross fence')).properties;
    const { status, body } = await manager.json<{ crossing: { inputs: { floodMarkM: number }; design: { floods: { chosen: string; maxDepthM: number; fromRainfall: unknown } } } }>(
      'PATCH',
      `/api/properties/${propertyId}/crossings/${id}`,
      { floodMarkM: 1.4 },
    );
    expect(status).toBe(200);
    expect(body.crossing.inputs.floodMarkM).toBe(1.4);
    expect(body.crossing.design.floods.chosen).toBe('mark');
    expect(body.crossing.design.floods.maxDepthM).toBeCloseTo(1.4, 6);
    expect(body.crossing.design.floods.fromRainfall).not.toBeNull();
  });

  it.each([
    ['n = 0', { channelN: 0 }, 'channelN', /Manning's n below 0.01/],
    ['C above 1', { runoffCoefficient: 1.5 }, 'runoffCoefficient', /more water runs off than falls/],
    ['a negative freeboard', { freeboardM: -0.2 }, 'freeboardM', /cannot be negative/],
    ['an unknown field', { depth: 3 }, '_', /Unrecognized key/],
  ])('refuses %s with 422 and changes nothing', async (_label, change, field, message) => {
    const { id } = (await constructedCrossing('East paddock fence')).properties;
    const before = await manager.json<{ crossing: { inputs: unknown; computedAt: string } }>('GET', `/api/properties/${propertyId}/crossings/${id}`);
    const answer = await manager.json<{ fields: Record<string, string> }>('PATCH', `/api/properties/${propertyId}/crossings/${id}`, change);
    expect(answer.status).toBe(422);
    expect(answer.body.fields[field]).toMatch(message);
    const after = await manager.json<{ crossing: { inputs: unknown; computedAt: string } }>('GET', `/api/properties/${propertyId}/crossings/${id}`);
    expect(after.body.crossing).toEqual(before.body.crossing);
  });

  it('says so when the AEP asked for is not in the property’s IFD table', async () => {
    const { id } = (await constructedCrossing('East paddock fence')).properties;
    const { body } = await manager.json<{ crossing: { designStatus: string; design: { problem: string } } }>('PATCH', `/api/properties/${propertyId}/crossings/${id}`, { aepPercent: 0.5 });
    expect(body.crossing.designStatus).toBe('needs-input');
    expect(body.crossing.design.problem).toMatch(/AEP 0.5 % is not in/);
    await manager.json('PATCH', `/api/properties/${propertyId}/crossings/${id}`, { aepPercent: null });
  });
});

describe('realignment', () => {
  it('previews a dog-leg that squares the 35° crossing, and accepting it leaves a square crossing', async () => {
    const { id } = (await constructedCrossing('South cross fence')).properties;
    const preview = await manager.json<{ realignment: { fenceLine: { version: number }; suggestion: { ok: boolean; newAngleDeg: number; addedLengthM: number } } }>(
      'GET',
      `/api/properties/${propertyId}/crossings/${id}/realignment`,
    );
    expect(preview.body.realignment.suggestion.ok).toBe(true);
    expect(preview.body.realignment.suggestion.newAngleDeg).toBeCloseTo(90, 0);
    expect(preview.body.realignment.suggestion.addedLengthM).toBeGreaterThan(0);
    const accepted = await manager.json<{ fenceLine: { version: number } }>('POST', `/api/properties/${propertyId}/crossings/${id}/realignment`, { version: preview.body.realignment.fenceLine.version });
    expect(accepted.status).toBe(200);
    const after = await constructedCrossing('South cross fence');
    expect(after.properties.angleDeg).toBeGreaterThan(80);
    const stale = await manager.json<{ error: string }>('POST', `/api/properties/${propertyId}/crossings/${after.properties.id}/realignment`, { version: 1 });
    expect(stale.status).toBe(409);
  });
});

describe('fence lines that cannot be used', () => {
  it('drops a repeated vertex (a double click) and refuses a line that crosses itself', async () => {
    const doubled = await manager.json<{ fenceLine: { coordinates: number[][] } }>('POST', `/api/properties/${propertyId}/fence-lines`, {
      name: 'Double click',
      coordinates: [[141.64, -31.44], [141.645, -31.44], [141.645, -31.44], [141.65, -31.441]],
    });
    expect(doubled.status).toBe(201);
    expect(doubled.body.fenceLine.coordinates).toHaveLength(3);
    const before = await rowCounts('fence_lines');
    const crossed = await manager.json<{ fields: Record<string, string> }>('POST', `/api/properties/${propertyId}/fence-lines`, {
      name: 'Figure eight',
      coordinates: [[141.64, -31.44], [141.65, -31.45], [141.65, -31.44], [141.64, -31.45]],
    });
    expect(crossed.status).toBe(422);
    expect(crossed.body.fields.coordinates).toMatch(/cross/i);
    expect(await rowCounts('fence_lines')).toEqual(before);
  });
});

describe('fences at the edge of the elevation model', () => {
  it('designs what it can of a fence that runs off the model and crosses the creek by its edge, saying what it could not check', async () => {
    // From 300 m west of the model to inside it, 20 m north of its south edge, across the main creek
    // where it leaves the model (extent and creek in data-samples/saltbush-rise.json).
    const south = -31.4531803 + 20 / 110_900;
    const created = await manager.json<{ fenceLine: { id: number } }>('POST', `/api/properties/${propertyId}/fence-lines`, {
      name: 'Edge fence',
      coordinates: [[141.6313144 - 300 / 95_000, south], [141.6560, south]],
    });
    expect(created.status).toBe(201);
    const own = (await crossings()).filter((f) => f.properties.fenceLineId === created.body.fenceLine.id);
    expect(own.length).toBeGreaterThan(0);
    for (const feature of own) expect(['designed', 'needs-input', 'no-channel', 'failed', 'runs-along', 'touch']).toContain(feature.properties.designStatus);
    const details = await Promise.all(
      own.map((f) => manager.json<{ crossing: { designStatus: string; provisional: boolean; design: { problem?: string; warnings?: string[] } } }>('GET', `/api/properties/${propertyId}/crossings/${f.properties.id}`)),
    );
    for (const { status, body } of details) {
      expect(status).toBe(200);
      const said = body.crossing.design.problem ?? (body.crossing.design.warnings ?? []).join(' ');
      if (body.crossing.designStatus !== 'designed' || body.crossing.provisional) expect(said.length).toBeGreaterThan(10);
    }
  });
});

describe('the crossing list', () => {
  it('shows the same design figures as each crossing’s full design', async () => {
    type Figures = { provisional: boolean; style: string | null; floodLevelM: number | null; floodgateLengthM: number | null };
    const listed = (await crossings()) as unknown as { properties: Figures & { id: number; designStatus: string } }[];
    expect(listed.some((f) => f.properties.designStatus === 'designed' && f.properties.style !== null && f.properties.floodLevelM !== null)).toBe(true);
    for (const { properties } of listed) {
      const { body } = await manager.json<{ crossing: Figures }>('GET', `/api/properties/${propertyId}/crossings/${properties.id}`);
      const pick = ({ provisional, style, floodLevelM, floodgateLengthM }: Figures) => ({ provisional, style, floodLevelM, floodgateLengthM });
      expect(pick(properties)).toEqual(pick(body.crossing));
    }
  });
});

describe('materials and cost', () => {
  it('prices every fence line from the price list, with a CSV of the same', async () => {
    const { body } = await manager.json<{ costs: { fenceLines: { name: string; priced: { totalCents: number; complete: boolean } }[]; totals: { totalCents: number; complete: boolean } } }>(
      'GET',
      `/api/properties/${propertyId}/costs`,
    );
    expect(body.costs.totals.totalCents).toBeGreaterThan(0);
    expect(body.costs.totals.complete).toBe(true);
    const csv = await (await manager.request('GET', `/api/properties/${propertyId}/materials.csv`)).text();
    const [header, ...rows] = csv.trim().split('\n');
    expect(header).toBe('fence_line,code,description,unit,quantity,unit_price,total');
    expect(rows.some((row) => row.startsWith('North cross fence,STRAINER_ASSEMBLY'))).toBe(true);
  });

  it('prices each designed crossing on its own, as a part of its fence line', async () => {
    type Costs = { fenceLines: { fenceLineId: number; priced: { totalCents: number } }[]; crossings: { crossingId: number; fenceLineId: number; totalCents: number; complete: boolean }[] };
    const { body } = await manager.json<{ costs: Costs }>('GET', `/api/properties/${propertyId}/costs`);
    const designed = (await crossings()).filter((f) => f.properties.designStatus === 'designed');
    const byNumber = (a: number, b: number) => a - b;
    expect(body.costs.crossings.map((c) => c.crossingId).sort(byNumber)).toEqual(designed.map((f) => f.properties.id).sort(byNumber));
    for (const crossing of body.costs.crossings) {
      const fence = body.costs.fenceLines.find((f) => f.fenceLineId === crossing.fenceLineId)!;
      expect(crossing.complete).toBe(true);
      expect(crossing.totalCents).toBeGreaterThan(0);
      expect(crossing.totalCents).toBeLessThan(fence.priced.totalCents);
    }
  });

  it('refuses a price list with an id priced twice in one unit, naming the row, and keeps the stored one', async () => {
    const before = (await manager.json<{ settings: { version: number; priceList: unknown[] } }>('GET', `/api/properties/${propertyId}/settings`)).body.settings;
    const twice = [...prices.items, { ...(prices.items[0] as object), unitPriceCents: 1 }];
    const { status, body } = await manager.json<{ fields: Record<string, string> }>('PATCH', `/api/properties/${propertyId}/settings`, { version: before.version, priceList: twice });
    expect(status).toBe(422);
    expect(body.fields[`priceList.${prices.items.length}.code`]).toMatch(/already priced on row 1/);
    const after = (await manager.json<{ settings: { version: number; priceList: unknown[] } }>('GET', `/api/properties/${propertyId}/settings`)).body.settings;
    expect(after).toEqual(before);
  });
});

describe('a burst of fence edits', () => {
  it('stores, by the time each edit is answered, the crossings a fresh analysis of the whole property finds', async () => {
    // Five copies of the North cross fence 60 m apart, all moved 20 m east at once: the analyses
    // they ask for wait together, and every answered edit must already have its crossings.
    const north = manifest.fenceLines.find((f) => f.name === 'North cross fence')!.pointsLonLat;
    const shifted = (dLon: number, dLat: number) => north.map(([lon, lat]) => [lon + dLon, lat + dLat] as [number, number]);
    const created = [];
    for (let i = 1; i <= 5; i += 1) {
      const { status, body } = await manager.json<{ fenceLine: { id: number; version: number } }>('POST', `/api/properties/${propertyId}/fence-lines`, { name: `Burst ${i}`, coordinates: shifted(0, i * 0.00055) });
      expect(status).toBe(201);
      created.push({ ...body.fenceLine, index: i });
    }
    const answers = await Promise.all(
      created.map(({ id, version, index }) => manager.json('PATCH', `/api/properties/${propertyId}/fence-lines/${id}`, { version, coordinates: shifted(0.0002, index * 0.00055) })),
    );
    expect(answers.map((answer) => answer.status)).toEqual([200, 200, 200, 200, 200]);
    const place = (f: Feature) => `${f.properties.fenceLineId} ${f.properties.kind} ${f.geometry.coordinates.map((v) => v.toFixed(6)).join(',')} ${(f.properties.angleDeg as number | null)?.toFixed(1) ?? "-"} ${f.properties.designStatus}`;
    const afterBurst = (await crossings()).map(place).sort();
    for (const { id } of created) expect(afterBurst.some((p) => p.startsWith(`${id} crossing`)), `a crossing of fence ${id}`).toBe(true);
    expect((await manager.json('POST', `/api/properties/${propertyId}/crossings/analyse`)).status).toBe(200);
    expect((await crossings()).map(place).sort()).toEqual(afterBurst);
  });
});

describe('a crossing\'s full design, kept between reads', () => {
  it('follows a new name of its fence line, new prices and new inputs at once', async () => {
    type Detail = { crossing: { fenceName: string; inputs: { floodMarkM?: number | null }; design: { comparison?: { sides: { cost?: { materialsCents: number } }[] } } } };
    const { id, fenceLineId } = (await constructedCrossing('North cross fence')).properties;
    const route = `/api/properties/${propertyId}/crossings/${id}`;
    const first = (await manager.json<Detail>('GET', route)).body.crossing;
    expect((await manager.json<Detail>('GET', route)).body.crossing).toEqual(first);

    const fence = (await manager.json<{ fenceLine: { version: number } }>('GET', `/api/properties/${propertyId}/fence-lines/${fenceLineId}`)).body.fenceLine;
    expect((await manager.json('PATCH', `/api/properties/${propertyId}/fence-lines/${fenceLineId}`, { version: fence.version, name: 'North cross fence (renamed)' })).status).toBe(200);
    const renamed = (await manager.json<Detail>('GET', route)).body.crossing;
    expect(renamed.fenceName).toBe('North cross fence (renamed)');

    const settings = (await manager.json<{ settings: { version: number; priceList: { unitPriceCents: number }[] } }>('GET', `/api/properties/${propertyId}/settings`)).body.settings;
    const doubled = settings.priceList.map((item) => ({ ...item, unitPriceCents: item.unitPriceCents * 2 }));
    expect((await manager.json('PATCH', `/api/properties/${propertyId}/settings`, { version: settings.version, priceList: doubled })).status).toBe(200);
    const repriced = (await manager.json<Detail>('GET', route)).body.crossing;
    const materials = (detail: typeof first) => detail.design.comparison!.sides.map((side) => side.cost!.materialsCents);
    expect(materials(repriced)).toEqual(materials(renamed).map((cents) => cents * 2));

    expect((await manager.json('PATCH', route, { floodMarkM: 1.2 })).status).toBe(200);
    expect((await manager.json<Detail>('GET', route)).body.crossing.inputs.floodMarkM).toBe(1.2);
  });
});
