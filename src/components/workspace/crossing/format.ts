/** How the crossing list and detail write numbers: Australian English, a dash for an unknown value. */

const numberFormat = new Intl.NumberFormat('en-AU', { maximumFractionDigits: 0 });

/** Metres along a fence line, e.g. "1,241 m". */
export function formatChainage(chainageM: number): string {
  return `${numberFormat.format(chainageM)} m`;
}

/** A number with a fixed count of decimals and its unit, or a dash when unknown. */
export function formatValue(value: number | null | undefined, digits: number, unit: string): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  return `${value.toLocaleString('en-AU', { minimumFractionDigits: digits, maximumFractionDigits: digits })}${unit ? ` ${unit}` : ''}`;
}

/** Upstream area: whole hectares from 10 ha, one decimal below. */
export function formatArea(areaHa: number | null | undefined): string {
  if (areaHa === null || areaHa === undefined) return '—';
  return formatValue(areaHa, areaHa >= 10 ? 0 : 1, 'ha');
}

/** A length or height in metres, one decimal unless told. */
export function formatMetres(valueM: number | null | undefined, digits = 1): string {
  return formatValue(valueM, digits, 'm');
}

/** A force given in newtons, written in kilonewtons with two decimals. */
export function formatKilonewtons(newtons: number): string {
  return formatValue(newtons / 1000, 2, 'kN');
}
