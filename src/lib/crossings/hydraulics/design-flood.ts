import { rainfallIntensity, type IfdTable } from './ifd';
import { HydraulicsInputError } from './input-error';
import { rationalPeakDischarge } from './rational-method';
import { HYDRAULICS_SOURCES } from './sources';
import { bransbyWilliamsTcMin, kirpichTcMin, pilgrimMcDermottTcMin } from './time-of-concentration';

/** The formula for the time of concentration. */
export type TcMethod = 'bransby-williams' | 'pilgrim-mcdermott' | 'kirpich';

/** What {@link designFloodFromRainfall} needs to know. */
export interface DesignFloodInputs {
  readonly catchment: {
    readonly areaKm2: number;
    readonly mainStreamLengthKm: number;
    /** Equal-area slope of the main stream, m/km. */
    readonly equalAreaSlopeMPerKm: number;
    /** Average slope of the main stream (fall / length), m/m; Kirpich's S. Optional. */
    readonly averageSlopeMPerM?: number;
  };
  readonly ifd: IfdTable;
  /** Annual exceedance probability of the design flood, per cent; one of the IFD table's. */
  readonly aepPercent: number;
  /** Runoff coefficient C, (0, 1]. */
  readonly runoffCoefficient: number;
  readonly tcMethod: TcMethod;
}

/** A design discharge from rainfall, with everything needed to re-run and explain it. */
export interface DesignFlood {
  /** Time of concentration, minutes; also the storm duration. */
  readonly tcMin: number;
  readonly intensityMmH: number;
  /** Peak discharge, m³/s. */
  readonly dischargeM3s: number;
  readonly aepPercent: number;
  /** The method in words, with the formulas used. */
  readonly method: string;
  readonly sources: readonly string[];
  /** A copy of the inputs. */
  readonly inputs: DesignFloodInputs;
  /** What the number is good for; always shown with it. */
  readonly caveats: readonly string[];
  /** Things about these inputs that weaken the answer. */
  readonly warnings: readonly string[];
}

/** Shown with every Rational-method flood (Gullyline references: ARR 1987 Book IV, ARR 2016/2019). */
export const RATIONAL_SCREENING_CAVEAT =
  'A Rational-method flood is a screening estimate: Australian Rainfall and Runoff 2016/2019 replaced the Rational method for ungauged rural catchments with regional flood frequency estimation. An observed flood mark, where there is one, is the better guide.';

const TC_NAMES: Record<TcMethod, string> = {
  'bransby-williams': `Bransby-Williams, tc = 58 L / (A^0.1 Se^0.2) min (${HYDRAULICS_SOURCES.arr1987}, Book IV)`,
  'pilgrim-mcdermott': `Pilgrim–McDermott, tc = 0.76 A^0.38 h (${HYDRAULICS_SOURCES.arr1987}, Book IV)`,
  kirpich: `Kirpich, tc = 0.0195 L^0.77 S^-0.385 min (${HYDRAULICS_SOURCES.txdotHdm})`,
};

/**
 * The design peak discharge at a crossing from rainfall by the Rational method: time of
 * concentration by the chosen formula ({@link bransbyWilliamsTcMin}, {@link pilgrimMcDermottTcMin}
 * or {@link kirpichTcMin}), the intensity of a storm of that duration and AEP from the property's
 * IFD table ({@link rainfallIntensity}), then Q = C·I·A / 3.6 ({@link rationalPeakDischarge}).
 * A screening estimate: the result's `caveats` says so (ARR 2016/2019 replaced the Rational method
 * for ungauged rural catchments).
 *
 * @param inputs - catchment (km², km, m/km), IFD table, AEP (%), C and the tc formula; not modified
 * @returns tc (min), I (mm/h), Q (m³/s), method, sources, a copy of the inputs, caveats and warnings
 * @throws HydraulicsInputError for a bad catchment value, C, tc formula, IFD table, an AEP not in
 *   the table, or a tc outside the table's durations
 */
export function designFloodFromRainfall(inputs: DesignFloodInputs): DesignFlood {
  const { catchment, tcMethod } = inputs;
  if (catchment === null || typeof catchment !== 'object') {
    throw new HydraulicsInputError(
      'catchment',
      'Give the catchment: area (km²), main stream length (km) and equal-area slope (m/km).',
    );
  }
  if (typeof tcMethod !== 'string' || !Object.hasOwn(TC_NAMES, tcMethod)) {
    throw new HydraulicsInputError('tcMethod', `Choose the time of concentration formula: ${Object.keys(TC_NAMES).join(', ')}.`);
  }
  const warnings: string[] = [];
  let tcMin: number;
  if (tcMethod === 'bransby-williams') tcMin = bransbyWilliamsTcMin(catchment);
  else if (tcMethod === 'pilgrim-mcdermott') tcMin = pilgrimMcDermottTcMin(catchment);
  else {
    let slopeMPerM = catchment.averageSlopeMPerM;
    if (slopeMPerM === undefined) {
      slopeMPerM = catchment.equalAreaSlopeMPerKm / 1000;
      warnings.push(
        "Kirpich's slope is the average slope of the main stream; none was given, so its equal-area slope was used. On a creek that is steep at its head this gives a longer tc and a smaller flood.",
      );
    }
    tcMin = kirpichTcMin({ lengthM: catchment.mainStreamLengthKm * 1000, slopeMPerM });
  }
  const intensityMmH = rainfallIntensity(inputs.ifd, tcMin, inputs.aepPercent);
  const dischargeM3s = rationalPeakDischarge({
    runoffCoefficient: inputs.runoffCoefficient,
    intensityMmH,
    areaKm2: catchment.areaKm2,
  });
  return {
    tcMin,
    intensityMmH,
    dischargeM3s,
    aepPercent: inputs.aepPercent,
    method: `Rational method Q = C·I·A / 3.6 (m³/s, mm/h, km²); storm duration = time of concentration by ${TC_NAMES[tcMethod]}; intensity from the property's IFD table, log–log interpolation between durations`,
    sources: [
      HYDRAULICS_SOURCES.rational,
      HYDRAULICS_SOURCES.arr1987,
      HYDRAULICS_SOURCES.arr2019,
      ...(tcMethod === 'kirpich' ? [HYDRAULICS_SOURCES.txdotHdm] : []),
    ],
    inputs: copyInputs(inputs),
    caveats: [RATIONAL_SCREENING_CAVEAT],
    warnings,
  };
}

function copyInputs(inputs: DesignFloodInputs): DesignFloodInputs {
  const { catchment, ifd } = inputs;
  return {
    catchment: { ...catchment },
    ifd: {
      aepPercent: [...ifd.aepPercent],
      durationsMin: [...ifd.durationsMin],
      intensitiesMmH: ifd.intensitiesMmH.map((row) => [...row]),
    },
    aepPercent: inputs.aepPercent,
    runoffCoefficient: inputs.runoffCoefficient,
    tcMethod: inputs.tcMethod,
  };
}
