/**
 * Internal D8 code of a valid cell whose direction is not known yet: a cell of a flat, with no
 * lower neighbour, away from the grid's edge and from nodata. Never left in a returned array.
 */
export const D8_UNRESOLVED = 254;
