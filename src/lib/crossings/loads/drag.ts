/**
 * Hydrodynamic drag on an object in flowing water.
 */
import { checkNumber } from '../wire/check-number';

/** Drag inputs, SI. */
export interface DragInput {
  /** Drag coefficient C_d, > 0: 2.0 for a flat plate or square pile, 1.2 for a round one (FEMA P-55). */
  readonly dragCoefficient: number;
  /** Area projected on a plane across the flow, m², ≥ 0. */
  readonly areaM2: number;
  /** Flow speed, m/s, ≥ 0. */
  readonly velocityMs: number;
  /** Water density, kg/m³, > 0 (default 1000, fresh water). */
  readonly densityKgM3?: number;
}

/**
 * Drag force F = ½ ρ C_d A V², newtons.
 *
 * Method: FEMA P-55 *Coastal Construction Manual* (4th ed., 2011), Eq. 8.8 (hydrodynamic load).
 *
 * @param input - see {@link DragInput}; not modified
 * @returns the drag force, newtons
 * @throws RangeError when a coefficient, area, speed or density is missing, negative or not finite
 */
export function dragForceN(input: DragInput): number {
  if (typeof input !== 'object' || input === null) {
    throw new TypeError('expected an object with dragCoefficient, areaM2 and velocityMs.');
  }
  const cd = checkNumber(input.dragCoefficient, {
    name: 'dragCoefficient', what: 'the drag coefficient', min: 0, minExclusive: true,
  });
  const area = checkNumber(input.areaM2, { name: 'areaM2', what: 'the projected area', unit: 'm²', min: 0 });
  const v = checkNumber(input.velocityMs, {
    name: 'velocityMs', what: 'the flow speed', unit: 'm/s', min: 0, hint: 'Give the speed, without a sign.',
  });
  const rho = checkNumber(input.densityKgM3 ?? 1000, {
    name: 'densityKgM3', what: 'the water density', unit: 'kg/m³', min: 0, minExclusive: true,
  });
  return 0.5 * rho * cd * area * v * v;
}
