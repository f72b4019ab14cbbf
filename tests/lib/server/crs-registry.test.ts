import { describe, expect, it } from 'vitest';
import { lookupCrs, requireProjectedCrs } from '../../../src/lib/server/crs-registry';
import { ValidationError } from '../../../src/lib/server/http';

// Expected names and parameters are the EPSG registry's (EPSG Geodetic Parameter Dataset, as
// packaged by epsg-index 2.0.0).
describe('CRS registry', () => {
  it('resolves GDA2020 / MGA zone 54 to its transverse Mercator definition', () => {
    const crs = requireProjectedCrs('EPSG:7854');
    expect(crs.name).toBe('GDA2020 / MGA zone 54');
    expect(crs.proj4).toContain('+proj=utm +zone=54 +south');
  });

  it('knows codes beyond a hand list', () => {
    expect(lookupCrs('EPSG:32754')?.name).toBe('WGS 84 / UTM zone 54S');
    expect(lookupCrs('EPSG:28354')?.name).toBe('GDA94 / MGA zone 54');
  });

  it('refuses unknown, malformed and geographic codes with a message naming the field', () => {
    expect(lookupCrs('EPSG:1')).toBeUndefined();
    expect(lookupCrs('7854')).toBeUndefined();
    for (const code of ['EPSG:99999', 'EPSG:4326', 'EPSG:7844']) {
      try {
        requireProjectedCrs(code);
        expect.unreachable(`${code} should be refused`);
      } catch (error) {
        expect(error).toBeInstanceOf(ValidationError);
        expect((error as ValidationError).fields?.crs).toContain(code);
      }
    }
  });
});
