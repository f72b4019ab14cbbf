/**
 * The wire table: figures against their published sources, internal consistency, and look-up.
 *
 * Outside references used here:
 * - The Press (Christchurch), 18 April 1980, "Galvanised wire" (N.Z. Wire Industries) and "Wire
 *   knots" (N.Z. Agricultural Engineering Institute): 25 kg coil of 2.50 mm H.T. = 648 m, of
 *   4.00 mm M.S. = 253 m; 2.5 mm H.T. ultimate strength 6650 N.
 * - UF IFAS Extension Circular 851 (Bucklin, Kunkle & Sand), "Construction of High Tensile Wire
 *   Fences": 12½-gauge high-tensile wire, 1600 lb a wire.
 * - BC Ministry of Agriculture Factsheet 307.100-1 (2015): 12½-gauge two-strand barbed, about
 *   950 lb breaking strength, 1320 ft rolls of about 80 lb.
 * - Steel density 7850 kg/m³ and E = 200 GPa: from memory (the usual structural values).
 */
import { describe, expect, it } from 'vitest';
import { WIRE_TYPES, findWireType, type WireFigure } from '../../../../src/lib/crossings/wire/index';

const STEEL_DENSITY_KG_M3 = 7850; // from memory
const FIGURES: readonly WireFigure[] = [
  'diameterMm', 'crossSectionAreaMm2', 'breakingLoadN', 'massKgPerM', 'rollLengthM', 'rollMassKg', 'modulusGPa',
];
const relErr = (actual: number, expected: number): number => Math.abs(actual - expected) / Math.abs(expected);

describe('WIRE_TYPES', () => {
  it('holds the wires the design engine needs', () => {
    const ids = WIRE_TYPES.map((w) => w.id);
    expect(ids).toEqual(expect.arrayContaining([
      'ht-2.50-plain', 'ms-4.00-plain', 'mt-3.15-plain', 'lt-12.5ga-barbed-2strand', 'ht-2.50-barbed-2strand',
    ]));
    expect(new Set(ids).size).toBe(ids.length);
  });

  it('gives every figure of every wire a positive finite value and a source with its basis', () => {
    for (const wire of WIRE_TYPES) {
      for (const figure of FIGURES) {
        expect(Number.isFinite(wire[figure]) && wire[figure] > 0, `${wire.id}.${figure}`).toBe(true);
        const source = wire.sources[figure];
        expect(['published', 'derived', 'from memory'], `${wire.id}.${figure}`).toContain(source.basis);
        expect(source.source.length, `${wire.id}.${figure}`).toBeGreaterThan(5);
      }
    }
  });

  it('2.50 mm high-tensile: 25 kg coil = 648 m agrees with 7850 kg/m³ (The Press, 18 April 1980)', () => {
    const wire = findWireType('ht-2.50-plain');
    expect(wire.rollLengthM).toBe(648);
    expect(wire.rollMassKg).toBe(25);
    expect(wire.sources.rollLengthM.basis).toBe('published');
    // π/4 × 2.5² mm² × 7850 kg/m³ = 0.03853 kg/m → 25 kg = 648.8 m.
    const metresFromDensity = 25 / (STEEL_DENSITY_KG_M3 * ((Math.PI / 4) * 2.5 ** 2 * 1e-6));
    expect(relErr(metresFromDensity, 648)).toBeLessThan(0.03);
    expect(relErr(wire.rollMassKg / wire.massKgPerM, wire.rollLengthM)).toBeLessThan(0.03);
  });

  it('4.00 mm mild steel: 25 kg coil = 253 m agrees with 7850 kg/m³ (The Press, 18 April 1980)', () => {
    const wire = findWireType('ms-4.00-plain');
    expect(wire.rollLengthM).toBe(253);
    expect(wire.sources.rollLengthM.basis).toBe('published');
    const metresFromDensity = 25 / (STEEL_DENSITY_KG_M3 * ((Math.PI / 4) * 4 ** 2 * 1e-6));
    expect(relErr(metresFromDensity, 253)).toBeLessThan(0.03);
    expect(relErr(wire.rollMassKg / wire.massKgPerM, wire.rollLengthM)).toBeLessThan(0.03);
  });

  it('every plain wire: roll mass ÷ mass per metre = roll length within 3 % (steel density 7850 kg/m³)', () => {
    for (const wire of WIRE_TYPES.filter((w) => !w.barbed)) {
      expect(relErr(wire.rollMassKg / wire.massKgPerM, wire.rollLengthM), wire.id).toBeLessThan(0.03);
      expect(relErr(wire.massKgPerM, STEEL_DENSITY_KG_M3 * wire.crossSectionAreaMm2 * 1e-6), wire.id).toBeLessThan(0.03);
    }
  });

  it('low-tensile barbed: 1320 ft of about 80 lb ≈ 90 g/m, two 2.5 mm line wires plus barbs (BC Factsheet 307.100-1)', () => {
    const wire = findWireType('lt-12.5ga-barbed-2strand');
    expect(wire.rollLengthM).toBeCloseTo(402.3, 1);
    expect(wire.rollMassKg).toBeCloseTo(36.3, 1);
    expect(wire.massKgPerM).toBeCloseTo(0.090, 3);
    expect(wire.breakingLoadN).toBeCloseTo(4226, 0); // 950 lbf
    // The line wires alone weigh 2 × 0.0385 = 0.0771 kg/m; the barbs add the rest (≈ 17 %).
    const lineWiresKgPerM = STEEL_DENSITY_KG_M3 * wire.crossSectionAreaMm2 * 1e-6;
    expect(lineWiresKgPerM).toBeCloseTo(0.0771, 4);
    expect(wire.massKgPerM / lineWiresKgPerM).toBeGreaterThan(1);
    expect(wire.massKgPerM / lineWiresKgPerM).toBeLessThan(1.25);
  });

  it('breaking loads: 2.5 mm H.T. 6650 N (The Press, 1980); US 12½-gauge H.T. 1600 lb = 7117 N (UF IFAS Circular 851)', () => {
    expect(findWireType('ht-2.50-plain').breakingLoadN).toBe(6650);
    expect(findWireType('ht-2.50-plain').sources.breakingLoadN.basis).toBe('published');
    expect(findWireType('ht-12.5ga-plain-us').breakingLoadN).toBeCloseTo(7117, 0);
  });

  it('2.5 mm wire: A = 4.909 mm², EA = 981.7 kN with E = 200 GPa (references.md, derived; E from memory)', () => {
    const wire = findWireType('ht-2.50-plain');
    expect(wire.crossSectionAreaMm2).toBeCloseTo(4.909, 3);
    expect(wire.modulusGPa).toBe(200);
    const eaKn = wire.modulusGPa * wire.crossSectionAreaMm2; // GPa × mm² = kN
    expect(relErr(eaKn, 981.7)).toBeLessThan(0.005);
    // ΔL = T L / (E A): 1 kN over 100 m stretches 0.102 m.
    expect((1000 * 100) / (eaKn * 1000)).toBeCloseTo(0.102, 3);
  });

  it('marks barbed wires as barbed with two load-carrying strands', () => {
    for (const wire of WIRE_TYPES) {
      expect(wire.strandCount, wire.id).toBe(wire.barbed ? 2 : 1);
      expect(relErr(wire.crossSectionAreaMm2, wire.strandCount * (Math.PI / 4) * wire.diameterMm ** 2), wire.id).toBeLessThan(1e-12);
    }
  });

  it('cannot be changed by a caller', () => {
    const wire = findWireType('ht-2.50-plain');
    expect(Object.isFrozen(WIRE_TYPES)).toBe(true);
    expect(Object.isFrozen(wire)).toBe(true);
    expect(Object.isFrozen(wire.sources)).toBe(true);
    expect(Object.isFrozen(wire.sources.breakingLoadN)).toBe(true);
    expect(() => {
      (wire as { breakingLoadN: number }).breakingLoadN = 1;
    }).toThrow(TypeError);
  });
});

describe('findWireType', () => {
  it('finds a wire by id', () => {
    expect(findWireType('mt-3.15-plain').diameterMm).toBe(3.15);
  });

  it('names an unknown id and lists the known ones', () => {
    expect(() => findWireType('ht-2.5')).toThrow(RangeError);
    expect(() => findWireType('ht-2.5')).toThrow(/unknown wire type "ht-2\.5".*ht-2\.50-plain/);
  });
});
