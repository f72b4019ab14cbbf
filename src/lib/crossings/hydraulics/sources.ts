/**
 * The published sources the hydraulics core follows, named once so that results can quote them
 * (every result says which method and source produced it, so a design can be re-run and explained).
 */
export const HYDRAULICS_SOURCES = {
  chow1959: 'Chow, V. T. (1959) Open-Channel Hydraulics, McGraw-Hill, New York',
  chowTable56: "Chow, V. T. (1959) Open-Channel Hydraulics, Table 5-6 (values of Manning's n)",
  hecRas:
    'US Army Corps of Engineers, Hydrologic Engineering Center, HEC-RAS Hydraulic Reference Manual (conveyance subdivision at bank stations)',
  rational: 'Rational method, Q = C·I·A / 3.6 (Q m³/s, I mm/h, A km²)',
  arr1987:
    'Pilgrim, D. H. (ed.) (1987) Australian Rainfall and Runoff: A Guide to Flood Estimation, Institution of Engineers, Australia',
  arr2019:
    'Ball, J. et al. (eds) (2019) Australian Rainfall and Runoff: A Guide to Flood Estimation, Commonwealth of Australia (Geoscience Australia)',
  txdotHdm: 'Texas Department of Transportation, Hydraulic Design Manual, chapter 4, section 11 (Kirpich, SI form)',
  nrcs206d:
    'USDA Natural Resources Conservation Service, Hydrology Training Series Module 206D "Peak Discharge (Other Methods)" study guide, runoff coefficients for agricultural areas',
} as const;
