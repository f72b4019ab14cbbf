/**
 * A table of common fencing wires, every figure with its source, and a look-up by id.
 *
 * Figures are labelled as in `shared/references.md`: **published** (read in the named source),
 * **derived** (computed here from published or stated figures), **from memory** (a standard value
 * not read in a source: check the maker's label before leaning on it).
 */

/** How a figure was obtained. */
export type FigureBasis = 'published' | 'derived' | 'from memory';

/** Where one figure of the table comes from. */
export interface FigureSource {
  readonly basis: FigureBasis;
  /** The source, or for a derived figure how it was computed and from what. */
  readonly source: string;
}

/** Steel grade of the wire as the trade names it. */
export type WireGrade = 'high tensile' | 'medium tensile' | 'mild steel' | 'low tensile';

/** The numeric figures of a wire type; each has a {@link FigureSource}. */
export type WireFigure =
  | 'diameterMm'
  | 'crossSectionAreaMm2'
  | 'breakingLoadN'
  | 'massKgPerM'
  | 'rollLengthM'
  | 'rollMassKg'
  | 'modulusGPa';

/** One fencing wire. For barbed wire the figures are for the whole twisted strand. */
export interface WireType {
  /** Stable id, e.g. `ht-2.50-plain`. */
  readonly id: string;
  /** Name as shown to a person. */
  readonly name: string;
  readonly grade: WireGrade;
  readonly barbed: boolean;
  /** Load-carrying line wires: 1 for plain, 2 for two-strand barbed. */
  readonly strandCount: 1 | 2;
  /** Diameter of one line wire, millimetres. */
  readonly diameterMm: number;
  /** Steel cross-section carrying the load (all line wires, not the barbs), mm². */
  readonly crossSectionAreaMm2: number;
  /** Load at which the wire (the whole strand, if barbed) breaks, newtons. */
  readonly breakingLoadN: number;
  /** Mass per metre of wire as sold (barbs included), kg/m. */
  readonly massKgPerM: number;
  /** Length of wire in one coil or roll, metres. */
  readonly rollLengthM: number;
  /** Mass of one coil or roll, kilograms. */
  readonly rollMassKg: number;
  /** Young's modulus of the steel, GPa. */
  readonly modulusGPa: number;
  /** Cautions in plain words. */
  readonly notes: readonly string[];
  /** The source of every figure above. */
  readonly sources: { readonly [K in WireFigure]: FigureSource };
}

const PRESS_1980 =
  'The Press (Christchurch), 18 April 1980: "Galvanised wire" (N.Z. Wire Industries) and "Wire knots" (tests by the N.Z. Agricultural Engineering Institute)';
const UF_851 =
  'Bucklin, Kunkle & Sand, "Construction of High Tensile Wire Fences", University of Florida IFAS Extension, Circular 851';
const BC_307 =
  'British Columbia Ministry of Agriculture, "Commonly Used Wire for Agricultural Fences", Factsheet 307.100-1 (revised December 2015)';

/** Density of steel, kg/m³ (from memory; the usual structural value). */
const STEEL_DENSITY_KG_M3 = 7850;
const LBF_N = 4.4482216152605;
const FT_M = 0.3048;
const LB_KG = 0.45359237;

const published = (source: string): FigureSource => ({ basis: 'published', source });
const derived = (source: string): FigureSource => ({ basis: 'derived', source });
const fromMemory = (source: string): FigureSource => ({ basis: 'from memory', source });

const E_STEEL = fromMemory('200 GPa, the usual structural value for steel');
const AREA_ONE = derived('π d² / 4 from the diameter');
const AREA_TWO = derived('two line wires, 2 × π d² / 4 from the diameter (barbs carry no load)');
const MASS_FROM_DENSITY = derived(`steel density ${STEEL_DENSITY_KG_M3} kg/m³ (from memory) × cross-section area`);

const circleAreaMm2 = (diameterMm: number): number => (Math.PI * diameterMm * diameterMm) / 4;
/** kg/m of a steel section of `areaMm2`. */
const steelMassKgPerM = (areaMm2: number): number => STEEL_DENSITY_KG_M3 * areaMm2 * 1e-6;

function htPlain250(): WireType {
  const area = circleAreaMm2(2.5);
  return {
    id: 'ht-2.50-plain',
    name: '2.50 mm high-tensile galvanised plain',
    grade: 'high tensile',
    barbed: false,
    strandCount: 1,
    diameterMm: 2.5,
    crossSectionAreaMm2: area,
    breakingLoadN: 6650,
    massKgPerM: steelMassKgPerM(area),
    rollLengthM: 648,
    rollMassKg: 25,
    modulusGPa: 200,
    notes: [
      'Knots weaken it: a reef knot held 67 %, a figure-eight 65 % and a double loop 44 % of the wire\'s strength (The Press, 18 April 1980).',
      'US 12½-gauge high-tensile wire is rated higher, about 7.1 kN (UF IFAS Circular 851); the lower NZ test value is used here.',
    ],
    sources: {
      diameterMm: published(PRESS_1980),
      crossSectionAreaMm2: AREA_ONE,
      breakingLoadN: published(`${PRESS_1980}: ultimate strength 6650 N`),
      massKgPerM: MASS_FROM_DENSITY,
      rollLengthM: published(`${PRESS_1980}: a 25 kg coil extends 648 m`),
      rollMassKg: published(`${PRESS_1980}: 25 kg coil`),
      modulusGPa: E_STEEL,
    },
  };
}

function msPlain400(): WireType {
  const area = circleAreaMm2(4);
  return {
    id: 'ms-4.00-plain',
    name: '4.00 mm mild-steel galvanised plain',
    grade: 'mild steel',
    barbed: false,
    strandCount: 1,
    diameterMm: 4,
    crossSectionAreaMm2: area,
    breakingLoadN: 5500,
    massKgPerM: steelMassKgPerM(area),
    rollLengthM: 253,
    rollMassKg: 25,
    modulusGPa: 200,
    notes: ['Mild steel stretches and stays stretched once loaded past its yield point; re-strain after a flood.'],
    sources: {
      diameterMm: published(PRESS_1980),
      crossSectionAreaMm2: AREA_ONE,
      breakingLoadN: fromMemory('about 5–6 kN; 5.5 kN taken'),
      massKgPerM: MASS_FROM_DENSITY,
      rollLengthM: published(`${PRESS_1980}: a 25 kg coil extends 253 m`),
      rollMassKg: published(`${PRESS_1980}: 25 kg coil`),
      modulusGPa: E_STEEL,
    },
  };
}

function mtPlain315(): WireType {
  const area = circleAreaMm2(3.15);
  const mass = steelMassKgPerM(area);
  return {
    id: 'mt-3.15-plain',
    name: '3.15 mm medium-tensile galvanised plain',
    grade: 'medium tensile',
    barbed: false,
    strandCount: 1,
    diameterMm: 3.15,
    crossSectionAreaMm2: area,
    breakingLoadN: 5500,
    massKgPerM: mass,
    rollLengthM: Math.round(25 / mass),
    rollMassKg: 25,
    modulusGPa: 200,
    notes: ['Breaking load not found in a source: check the maker\'s label before relying on it.'],
    sources: {
      diameterMm: fromMemory('3.15 mm, a common Australian and NZ medium-tensile size'),
      crossSectionAreaMm2: AREA_ONE,
      breakingLoadN: fromMemory('about 5.5 kN (medium-tensile steel of about 700 MPa × 7.79 mm²)'),
      massKgPerM: MASS_FROM_DENSITY,
      rollLengthM: derived('25 kg coil ÷ mass per metre, rounded to the metre'),
      rollMassKg: fromMemory('25 kg coils, as for the other plain wires'),
      modulusGPa: E_STEEL,
    },
  };
}

function htPlain125Gauge(): WireType {
  const area = circleAreaMm2(2.5);
  const mass = steelMassKgPerM(area);
  const lengthM = 4000 * FT_M;
  return {
    id: 'ht-12.5ga-plain-us',
    name: '12½-gauge (2.5 mm) high-tensile plain, US 200 ksi grade',
    grade: 'high tensile',
    barbed: false,
    strandCount: 1,
    diameterMm: 2.5,
    crossSectionAreaMm2: area,
    breakingLoadN: 1600 * LBF_N,
    massKgPerM: mass,
    rollLengthM: lengthM,
    rollMassKg: lengthM * mass,
    modulusGPa: 200,
    notes: ['Usually strained to about 250 lbf (1.1 kN) a wire (UF IFAS Circular 851).'],
    sources: {
      diameterMm: fromMemory('12½ gauge ≈ 0.099 in ≈ 2.5 mm'),
      crossSectionAreaMm2: AREA_ONE,
      breakingLoadN: published(`${UF_851}: a strength of 1600 lb for each wire (7117 N)`),
      massKgPerM: MASS_FROM_DENSITY,
      rollLengthM: fromMemory('4000 ft (1219 m) coils'),
      rollMassKg: derived('roll length × mass per metre'),
      modulusGPa: E_STEEL,
    },
  };
}

function ltBarbed125Gauge(): WireType {
  const lengthM = 1320 * FT_M;
  const massKg = 80 * LB_KG;
  return {
    id: 'lt-12.5ga-barbed-2strand',
    name: '12½-gauge (2.5 mm) low-tensile two-strand barbed',
    grade: 'low tensile',
    barbed: true,
    strandCount: 2,
    diameterMm: 2.5,
    crossSectionAreaMm2: 2 * circleAreaMm2(2.5),
    breakingLoadN: 950 * LBF_N,
    massKgPerM: massKg / lengthM,
    rollLengthM: lengthM,
    rollMassKg: massKg,
    modulusGPa: 200,
    notes: [
      'Barbed wire traps debris: keep it out of the flow (common practice, no published source).',
      'The two twisted strands straighten under first load, so the strand stretches more than solid steel at first; pre-tension it (BC Factsheet 307.100-1).',
    ],
    sources: {
      diameterMm: fromMemory('12½ gauge ≈ 0.099 in ≈ 2.5 mm'),
      crossSectionAreaMm2: AREA_TWO,
      breakingLoadN: published(`${BC_307}: breaking strength about 950 lb (4226 N)`),
      massKgPerM: derived('roll mass ÷ roll length, both published (BC Factsheet 307.100-1)'),
      rollLengthM: published(`${BC_307}: rolls of 1320 ft (402 m)`),
      rollMassKg: published(`${BC_307}: about 80 lb (36.3 kg) a roll`),
      modulusGPa: E_STEEL,
    },
  };
}

function htBarbed250(): WireType {
  const area = 2 * circleAreaMm2(2.5);
  // The barbs add steel that carries no load; about a tenth of the line wires' mass (from memory).
  const mass = steelMassKgPerM(area) * 1.1;
  return {
    id: 'ht-2.50-barbed-2strand',
    name: '2.5 mm high-tensile two-strand barbed',
    grade: 'high tensile',
    barbed: true,
    strandCount: 2,
    diameterMm: 2.5,
    crossSectionAreaMm2: area,
    breakingLoadN: 11000,
    massKgPerM: mass,
    rollLengthM: 500,
    rollMassKg: 500 * mass,
    modulusGPa: 200,
    notes: [
      'Not found in a source: breaking load and roll length are from memory; check the maker\'s label.',
      'Barbed wire traps debris: keep it out of the flow (common practice, no published source).',
    ],
    sources: {
      diameterMm: fromMemory('2.5 mm line wires'),
      crossSectionAreaMm2: AREA_TWO,
      breakingLoadN: fromMemory('about 11 kN for the strand, somewhat under twice one 2.5 mm high-tensile wire'),
      massKgPerM: derived(`two line wires at steel density ${STEEL_DENSITY_KG_M3} kg/m³ plus about 10 % for the barbs (allowance from memory)`),
      rollLengthM: fromMemory('500 m rolls'),
      rollMassKg: derived('roll length × mass per metre'),
      modulusGPa: E_STEEL,
    },
  };
}

function deepFreeze(wire: WireType): WireType {
  for (const source of Object.values(wire.sources)) Object.freeze(source);
  Object.freeze(wire.sources);
  Object.freeze(wire.notes);
  return Object.freeze(wire);
}

/** The wire table, frozen. Ids are stable; names are for people. */
export const WIRE_TYPES: readonly WireType[] = Object.freeze(
  [htPlain250(), msPlain400(), mtPlain315(), htPlain125Gauge(), ltBarbed125Gauge(), htBarbed250()].map(deepFreeze),
);

/**
 * The wire type with the given id from {@link WIRE_TYPES}.
 *
 * @param id - a wire type id, e.g. `ht-2.50-plain`
 * @returns the (frozen) wire type
 * @throws RangeError naming the unknown id and listing the known ones
 */
export function findWireType(id: string): WireType {
  const wire = WIRE_TYPES.find((w) => w.id === id);
  if (wire) return wire;
  throw new RangeError(
    `unknown wire type ${JSON.stringify(id)}; choose one of: ${WIRE_TYPES.map((w) => w.id).join(', ')}.`,
  );
}
