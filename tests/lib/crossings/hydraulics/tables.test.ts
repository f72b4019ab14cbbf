import { describe, expect, it } from 'vitest';
import { MANNING_N_CLASSES, roughnessClasses, RUNOFF_COEFFICIENTS } from '../../../../src/lib/crossings/hydraulics/index';

describe("Manning's n table", () => {
  it('holds the values of Chow (1959) Open-Channel Hydraulics, Table 5-6 (published, as listed in references.md)', () => {
    const byId = Object.fromEntries(MANNING_N_CLASSES.map((entry) => [entry.id, [entry.minN, entry.normalN, entry.maxN]]));
    expect(byId).toEqual({
      'stream-clean-straight': [0.025, 0.03, 0.033],
      'stream-clean-winding': [0.033, 0.04, 0.045],
      'stream-weedy-timber': [0.075, 0.1, 0.15],
      'floodplain-short-grass': [0.025, 0.03, 0.035],
      'floodplain-scattered-brush': [0.035, 0.05, 0.07],
      'floodplain-dense-brush-summer': [0.07, 0.1, 0.16],
    });
    for (const entry of MANNING_N_CLASSES) expect(entry.source).toMatch(/Chow.*1959.*Table 5-6/);
  });

  it('offers one select option per class, with the normal n in the label', () => {
    expect(roughnessClasses.map((option) => option.value)).toEqual(MANNING_N_CLASSES.map((entry) => entry.id));
    expect(roughnessClasses[0]!.label).toMatch(/n ≈ 0\.030/);
    expect(Object.isFrozen(MANNING_N_CLASSES[0])).toBe(true);
  });
});

describe('runoff coefficient table', () => {
  it('is marked from memory, cites its source, and holds C in (0, 1]', () => {
    for (const entry of RUNOFF_COEFFICIENTS) {
      expect(entry.basis).toBe('from memory');
      expect(entry.source).toMatch(/Module 206D/);
      for (const c of [entry.openSandyLoam, entry.clayAndSiltLoam, entry.tightClay]) expect(c > 0 && c <= 1).toBe(true);
    }
  });

  it('runs off more on tighter soil and on steeper ground (the shape of the table)', () => {
    for (const entry of RUNOFF_COEFFICIENTS) {
      expect(entry.openSandyLoam).toBeLessThan(entry.clayAndSiltLoam);
      expect(entry.clayAndSiltLoam).toBeLessThan(entry.tightClay);
    }
    for (const cover of ['woodland', 'pasture', 'cultivated'] as const) {
      const rows = RUNOFF_COEFFICIENTS.filter((entry) => entry.cover === cover);
      expect(rows.map((entry) => entry.topography)).toEqual(['flat', 'rolling', 'hilly']);
      for (let k = 1; k < rows.length; k++) expect(rows[k]!.clayAndSiltLoam).toBeGreaterThan(rows[k - 1]!.clayAndSiltLoam);
    }
  });
});
