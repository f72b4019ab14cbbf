const km = new Intl.NumberFormat('en-AU', { minimumFractionDigits: 2, maximumFractionDigits: 2 });
const m = new Intl.NumberFormat('en-AU', { maximumFractionDigits: 0 });
const ha = new Intl.NumberFormat('en-AU', { minimumFractionDigits: 1, maximumFractionDigits: 1 });

/** "840 m" under a kilometre, "1.24 km" from there. */
export const formatLength = (lengthM: number) => (lengthM < 1000 ? `${m.format(lengthM)} m` : `${km.format(lengthM / 1000)} km`);
export const formatArea = (areaHa: number) => `${ha.format(areaHa)} ha`;

/** The live measure of a shape being drawn, or an empty string before there is one. */
export const formatMeasures = ({ lengthM, areaHa }: { lengthM?: number; areaHa?: number }) =>
  lengthM !== undefined ? formatLength(lengthM) : areaHa !== undefined ? formatArea(areaHa) : '';
