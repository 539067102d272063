/**
 * Units for stated (declared) parcel areas and their size in square metres.
 * hectare = 10 000 m² and decare = 1 000 m² (SI-accepted metric land units, BIPM SI Brochure
 * table 8 for the hectare); acre = 4 840 international yd² = 4 046.856 422 4 m² (international
 * yard of 1959 = 0.9144 m exactly).
 */
export const AREA_UNITS = ['ha', 'm2', 'acres', 'decares'] as const;
export type AreaUnit = (typeof AREA_UNITS)[number];

export const SQUARE_METRES_PER_UNIT: Record<AreaUnit, number> = {
  ha: 10_000,
  m2: 1,
  acres: 4_046.856_422_4,
  decares: 1_000,
};

/** Converts a stated area to m². */
export function toSquareMetres(value: number, unit: AreaUnit): number {
  return value * SQUARE_METRES_PER_UNIT[unit];
}

/**
 * Area-measurement tolerance in m²: `metresPerPerimeterMetre` × perimeter, capped at `capM2`.
 * Defaults follow Commission Implementing Regulation (EU) No 809/2014, Art. 38(4): a buffer
 * of at most 1.25 m applied to the perimeter, absolute maximum 1.0 ha.
 */
export function areaToleranceM2(perimeterM: number, metresPerPerimeterMetre = 1.25, capM2 = 10_000): number {
  return Math.min(metresPerPerimeterMetre * perimeterM, capM2);
}
