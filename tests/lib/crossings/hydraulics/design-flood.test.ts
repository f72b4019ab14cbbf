import { describe, expect, it } from 'vitest';
import {
  bransbyWilliamsTcMin,
  designFloodFromRainfall,
  pilgrimMcDermottTcMin,
  rainfallIntensity,
  RATIONAL_SCREENING_CAVEAT,
  type DesignFloodInputs,
} from '../../../../src/lib/crossings/hydraulics/index';
import { frozen, INVENTED_IFD } from './helpers';

// An invented catchment (demo-like numbers, not a real place).
const inputs: DesignFloodInputs = {
  catchment: { areaKm2: 12, mainStreamLengthKm: 6, equalAreaSlopeMPerKm: 8 },
  ifd: INVENTED_IFD,
  aepPercent: 1,
  runoffCoefficient: 0.4,
  tcMethod: 'bransby-williams',
};

describe('designFloodFromRainfall', () => {
  it('chains tc → intensity → Q = C·I·A/3.6 and says how (derived from its parts)', () => {
    const flood = designFloodFromRainfall(inputs);
    const tcMin = bransbyWilliamsTcMin(inputs.catchment);
    expect(flood.tcMin).toBeCloseTo(tcMin, 12);
    expect(flood.tcMin).toBeCloseTo((58 * 6) / (12 ** 0.1 * 8 ** 0.2), 9);
    expect(flood.intensityMmH).toBeCloseTo(rainfallIntensity(INVENTED_IFD, tcMin, 1), 12);
    expect(flood.dischargeM3s).toBeCloseTo((0.4 * flood.intensityMmH * 12) / 3.6, 12);
    expect(flood.method).toMatch(/Bransby-Williams/);
    expect(flood.method).toMatch(/Rational method/);
    expect(flood.sources.join(' ')).toMatch(/Australian Rainfall and Runoff/);
    expect(flood.warnings).toEqual([]);
  });

  it('carries the screening caveat and a copy of its inputs', () => {
    const flood = designFloodFromRainfall(inputs);
    expect(flood.caveats).toContain(RATIONAL_SCREENING_CAVEAT);
    expect(RATIONAL_SCREENING_CAVEAT).toMatch(/screening estimate/);
    expect(RATIONAL_SCREENING_CAVEAT).toMatch(/ARR|Australian Rainfall and Runoff 2016\/2019 replaced/);
    expect(flood.inputs).toEqual(inputs);
    expect(flood.inputs.ifd.intensitiesMmH).not.toBe(inputs.ifd.intensitiesMmH);
  });

  it('uses Pilgrim–McDermott or Kirpich when asked; Kirpich without an average slope warns', () => {
    const pm = designFloodFromRainfall({ ...inputs, tcMethod: 'pilgrim-mcdermott' });
    expect(pm.tcMin).toBeCloseTo(pilgrimMcDermottTcMin({ areaKm2: 12 }), 12);
    const kirpich = designFloodFromRainfall({ ...inputs, tcMethod: 'kirpich' });
    expect(kirpich.tcMin).toBeCloseTo(0.0195 * 6000 ** 0.77 * 0.008 ** -0.385, 9);
    expect(kirpich.warnings[0]).toMatch(/equal-area slope was used/);
    const withAverage = designFloodFromRainfall({
      ...inputs,
      tcMethod: 'kirpich',
      catchment: { ...inputs.catchment, averageSlopeMPerM: 0.012 },
    });
    expect(withAverage.warnings).toEqual([]);
    expect(withAverage.tcMin).toBeLessThan(kirpich.tcMin);
  });

  it('does not change its inputs', () => {
    const frozenInputs = frozen(structuredClone(inputs));
    expect(() => designFloodFromRainfall(frozenInputs)).not.toThrow();
    expect(frozenInputs).toEqual(inputs);
  });

  it('refuses C > 1, an AEP not in the IFD table, a tc outside it, and an unknown tc formula', () => {
    expect(() => designFloodFromRainfall({ ...inputs, runoffCoefficient: 1.5 })).toThrow(/more water runs off than falls/);
    expect(() => designFloodFromRainfall({ ...inputs, aepPercent: 0.5 })).toThrow(/AEP 0.5 % is not in the property's IFD table/);
    const tiny = { areaKm2: 0.01, mainStreamLengthKm: 0.1, equalAreaSlopeMPerKm: 50 };
    expect(() => designFloodFromRainfall({ ...inputs, catchment: tiny, tcMethod: 'kirpich' })).toThrow(
      /outside the property's IFD table/,
    );
    const unknown = { ...inputs, tcMethod: 'toString' } as unknown as DesignFloodInputs;
    expect(() => designFloodFromRainfall(unknown)).toThrow(/Choose the time of concentration formula/);
  });
});
