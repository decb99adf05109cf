/** Design flow by the rational method with C = 1: Q [L/s] = i [mm/h] × A [m²] / 3600 (ASCE 7-05 Commentary C8). */
export function designFlow(intensityMmPerHour: number, areaM2: number): number {
  return (intensityMmPerHour * areaM2) / 3600;
}

/** The same in US units: Q [gpm] = 0.0104 × A [ft²] × i [in/h] (ASCE 7-05 Commentary C8). */
export function designFlowGpm(areaFt2: number, intensityInchPerHour: number): number {
  return 0.0104 * areaFt2 * intensityInchPerHour;
}

/** Water depth over an outlet assumed for its capacity: an assumption (common practice, no source). */
export const DESIGN_HEAD = 0.03;
const G = 9.81;

/**
 * Rough capacity of a round outlet in L/s: the smaller of weir flow over its rim (Francis,
 * Q = 1.84 L h^1.5, m³/s) and orifice flow through it (Q = 0.61 A √(2 g h)), from engineering
 * handbooks (docs/check-values.md, Hydraulics). A check, not a product rating.
 */
export function outletCapacity(diameter: number, head = DESIGN_HEAD): number {
  const weir = 1.84 * Math.PI * diameter * head ** 1.5;
  const orifice = 0.61 * ((Math.PI * diameter * diameter) / 4) * Math.sqrt(2 * G * head);
  return Math.min(weir, orifice) * 1000;
}
